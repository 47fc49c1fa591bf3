import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CaseDeadline } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** The five statutory stages, always in the same order. */
export const getDeadlines = (id: number, signal?: AbortSignal) =>
  api.get<{ deadlines: CaseDeadline[] }>(`/cases/${id}/deadlines`, { signal });

export const deadlinesQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.deadlines(id),
    queryFn: ({ signal }) => getDeadlines(id, signal),
    select: (data) => data.deadlines,
  });

export function useDeadlines(id: number) {
  return useQuery(deadlinesQueryOptions(id));
}
