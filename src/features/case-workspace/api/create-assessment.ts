import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshCaseWork } from "./refresh-case";
import type { Assessment, AssessmentInput } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** A new HHSRS assessment version; the server scores it and decides band and Category. */
export const createAssessment = (id: number, input: AssessmentInput) => api.post<Assessment>(`/cases/${id}/assessments`, input);

export function useCreateAssessment(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.assessments(id), "create"],
    mutationFn: (input: AssessmentInput) => createAssessment(id, input),
    onSuccess: () => refreshCaseWork(queryClient, id),
  });
}
