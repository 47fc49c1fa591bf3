import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CaseDto } from "./types";

export const getCase = (id: number, signal?: AbortSignal) => api.get<CaseDto>(`/cases/${id}`, { signal });

export const caseQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.detail(id),
    queryFn: ({ signal }) => getCase(id, signal),
  });

export function useCase(id: number) {
  return useQuery(caseQueryOptions(id));
}
