import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";
import { policyKeys } from "@/lib/query-keys";
import { POLICY_FIELDS, type LandlordPolicy, type PolicyView } from "./types";

// The form checks only that each box holds a whole number; the limits are the server's, and its
// messages are shown beside the fields.
const wholeNumber = (unit: string) =>
  z.string().trim().min(1, `Enter a number of ${unit}.`).regex(/^\d+$/, `Enter a whole number of ${unit}, using digits only.`);

export const policyFormSchema = z.object(
  Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, wholeNumber(f.unit.many)])) as Record<
    keyof LandlordPolicy,
    ReturnType<typeof wholeNumber>
  >,
);
export type PolicyFormValues = z.infer<typeof policyFormSchema>;

export const toFormValues = (policy: LandlordPolicy): PolicyFormValues =>
  Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, String(policy[f.name])])) as PolicyFormValues;

export const fromFormValues = (values: PolicyFormValues): LandlordPolicy =>
  Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, Number(values[f.name])])) as unknown as LandlordPolicy;

export const updatePolicy = (policy: LandlordPolicy) => api.put<PolicyView>("/policy", policy);

export function useUpdatePolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePolicy,
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.current(), policy),
  });
}
