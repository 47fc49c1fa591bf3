import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CaseEvent } from "./types";

export const getCaseEvents = (id: number, signal?: AbortSignal) =>
  api.get<{ events: CaseEvent[] }>(`/cases/${id}/events`, { signal });

export const caseEventsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.events(id),
    queryFn: ({ signal }) => getCaseEvents(id, signal),
    select: (data) => data.events,
  });

export function useCaseEvents(id: number) {
  return useQuery(caseEventsQueryOptions(id));
}
