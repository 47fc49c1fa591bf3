import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Triage } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** The triage priority: the score out of 100 and the parts it is made of. */
export const getTriage = (id: number, signal?: AbortSignal) => api.get<Triage>(`/cases/${id}/triage`, { signal });

export const triageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.triage(id),
    queryFn: ({ signal }) => getTriage(id, signal),
  });

export function useTriage(id: number) {
  return useQuery(triageQueryOptions(id));
}
