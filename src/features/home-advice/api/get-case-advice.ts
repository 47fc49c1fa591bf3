import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { HomeAdviceResponse } from "@/lib/contracts/home-advice";
import { homeAdviceKeys } from "./home-advice-keys";

export type HomeAdvice = HomeAdviceResponse;

export const getCaseAdvice = (caseId: number, signal?: AbortSignal) => api.get<HomeAdvice>(`/cases/${caseId}/advice`, { signal });

export const caseAdviceQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: homeAdviceKeys.forCase(caseId),
    queryFn: ({ signal }) => getCaseAdvice(caseId, signal),
  });

export function useCaseAdvice(caseId: number) {
  return useQuery(caseAdviceQueryOptions(caseId));
}
