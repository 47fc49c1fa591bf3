import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { HeatingSupportPolicyResponse } from "@/lib/contracts";
import { policyKeys } from "@/lib/query-keys";

export interface HeatingSupportFields {
  supportText: string;
  supportPhone: string;
  supportLink: string;
}

/** GET /api/policy/heating-support: the landlord's help for tenants who find heating hard to afford. */
export const getHeatingSupport = (signal?: AbortSignal) =>
  api.get<HeatingSupportPolicyResponse>("/policy/heating-support", { signal });

export const heatingSupportQueryOptions = () =>
  queryOptions({ queryKey: policyKeys.heatingSupport(), queryFn: ({ signal }) => getHeatingSupport(signal) });

export function useHeatingSupport() {
  return useQuery(heatingSupportQueryOptions());
}

/** PUT /api/policy/heating-support (empty phone or link: none). */
export function useUpdateHeatingSupport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (fields: HeatingSupportFields) => api.put<HeatingSupportPolicyResponse>("/policy/heating-support", fields),
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.heatingSupport(), policy),
  });
}

/** DELETE /api/policy/heating-support: tenants see our neutral wording again. */
export function useResetHeatingSupport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<HeatingSupportPolicyResponse>("/policy/heating-support"),
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.heatingSupport(), policy),
  });
}
