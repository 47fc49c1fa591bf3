import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintPolicyResponse } from "@/lib/contracts";
import { policyKeys } from "@/lib/query-keys";

/** DELETE /api/policy/complaints: the default timeframes, escalation route and letters apply again. */
export const resetComplaintPolicy = () => api.delete<ComplaintPolicyResponse>("/policy/complaints");

export function useResetComplaintPolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resetComplaintPolicy,
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.complaints(), policy),
  });
}
