import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { queueQuery, type QueueListParams } from "../lib/queue-view";
import { caseKeys } from "@/lib/query-keys";
import type { QueuePage } from "./types";

export const getCaseQueue = (params: QueueListParams, signal?: AbortSignal) =>
  api.get<QueuePage>("/cases", { query: queueQuery(params), signal });

export const caseQueueQueryOptions = (params: QueueListParams) =>
  queryOptions({
    queryKey: caseKeys.queue(params),
    queryFn: ({ signal }) => getCaseQueue(params, signal),
    // Keep the last page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });

export function useCaseQueue(params: QueueListParams, options: { enabled?: boolean } = {}) {
  return useQuery({ ...caseQueueQueryOptions(params), enabled: options.enabled ?? true });
}
