import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { OutboxPage, OutboxStatusName } from "@/lib/contracts";
import { outboxKeys } from "@/lib/query-keys";

export interface OutboxFilters {
  status: OutboxStatusName | "";
  page: number;
  pageSize: number;
}

export const getOutbox = (filters: OutboxFilters, signal?: AbortSignal) =>
  api.get<OutboxPage>("/outbox", {
    query: { status: filters.status || undefined, page: filters.page, pageSize: filters.pageSize },
    signal,
  });

export const outboxQueryOptions = (filters: OutboxFilters) =>
  queryOptions({
    queryKey: outboxKeys.list(filters),
    queryFn: ({ signal }) => getOutbox(filters, signal),
    placeholderData: keepPreviousData,
  });

export function useOutbox(filters: OutboxFilters) {
  return useQuery(outboxQueryOptions(filters));
}
