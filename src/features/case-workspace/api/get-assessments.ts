import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Assessment } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** Every HHSRS assessment version, oldest first. */
export const getAssessments = (id: number, signal?: AbortSignal) =>
  api.get<{ assessments: Assessment[] }>(`/cases/${id}/assessments`, { signal });

export const assessmentsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.assessments(id),
    queryFn: ({ signal }) => getAssessments(id, signal),
    select: (data) => data.assessments,
  });

export function useAssessments(id: number) {
  return useQuery(assessmentsQueryOptions(id));
}
