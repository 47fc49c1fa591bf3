import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintPolicyResponse } from "@/lib/contracts";
import { policyKeys } from "@/lib/query-keys";

/** GET /api/policy/complaints: the complaint timeframes, the escalation route and the letters' wording. */
export const getComplaintPolicy = (signal?: AbortSignal) => api.get<ComplaintPolicyResponse>("/policy/complaints", { signal });

export const complaintPolicyQueryOptions = () =>
  queryOptions({ queryKey: policyKeys.complaints(), queryFn: ({ signal }) => getComplaintPolicy(signal) });

export function useComplaintPolicy() {
  return useQuery(complaintPolicyQueryOptions());
}
