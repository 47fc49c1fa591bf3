import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CaseEvaluation } from "./types";

export const getCaseEvaluation = (id: number, signal?: AbortSignal) =>
  api.get<CaseEvaluation>(`/cases/${id}/evaluation`, { signal });

export const caseEvaluationQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.evaluation(id),
    queryFn: ({ signal }) => getCaseEvaluation(id, signal),
  });

export function useCaseEvaluation(id: number) {
  return useQuery(caseEvaluationQueryOptions(id));
}
