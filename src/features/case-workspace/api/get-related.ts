import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { RelatedCase } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** Other cases at the same home, newest first. */
export const getRelatedCases = (id: number, signal?: AbortSignal) =>
  api.get<{ cases: RelatedCase[] }>(`/cases/${id}/related`, { signal });

export const relatedCasesQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.related(id),
    queryFn: ({ signal }) => getRelatedCases(id, signal),
    select: (data) => data.cases,
  });

export function useRelatedCases(id: number) {
  return useQuery(relatedCasesQueryOptions(id));
}
