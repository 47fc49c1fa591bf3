import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintPolicyResponse } from "@/lib/contracts";
import { policyKeys } from "@/lib/query-keys";

export type ComplaintLetterKind = ComplaintPolicyResponse["letters"][number]["kind"];

export interface ComplaintPolicyUpdate {
  stage1AcknowledgeWorkingDays: number;
  stage1RespondWorkingDays: number;
  stage2AcknowledgeWorkingDays: number;
  stage2RespondWorkingDays: number;
  extensionMaxWorkingDays: number;
  /** null: our default wording. */
  escalationRoute: string | null;
  /** Each letter's wording; null puts ours back. */
  letters: Partial<Record<ComplaintLetterKind, { subject: string; body: string } | null>>;
}

/** PUT /api/policy/complaints. */
export const updateComplaintPolicy = (update: ComplaintPolicyUpdate) =>
  api.put<ComplaintPolicyResponse>("/policy/complaints", update);

export function useUpdateComplaintPolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateComplaintPolicy,
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.complaints(), policy),
  });
}
