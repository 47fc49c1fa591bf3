import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";
import { policyKeys } from "@/lib/query-keys";
import { isUkPhoneNumber, UK_PHONE_MESSAGE } from "@/lib/schemas/policy";
import { POLICY_FIELDS, type LandlordPolicy, type PolicyUpdate, type PolicyView } from "./types";

// The form checks only that each box holds a whole number; the limits are the server's, and its
// messages are shown beside the fields.
const wholeNumber = (unit: string) =>
  z.string().trim().min(1, `Enter a number of ${unit}.`).regex(/^\d+$/, `Enter a whole number of ${unit}, using digits only.`);

export const policyFormSchema = z.object({
  ...(Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, wholeNumber(f.unit.many)])) as Record<
    keyof LandlordPolicy,
    ReturnType<typeof wholeNumber>
  >),
  // The same rule as the server (src/lib/schemas/policy.ts); an empty box means no number.
  emergencyPhone: z
    .string()
    .trim()
    .refine((s) => s === "" || isUkPhoneNumber(s), UK_PHONE_MESSAGE),
});
export type PolicyFormValues = z.infer<typeof policyFormSchema>;

export const toFormValues = (policy: LandlordPolicy & { emergencyPhone?: string | null }): PolicyFormValues => ({
  ...(Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, String(policy[f.name])])) as Omit<PolicyFormValues, "emergencyPhone">),
  emergencyPhone: policy.emergencyPhone ?? "",
});

export const fromFormValues = (values: PolicyFormValues): PolicyUpdate => ({
  ...(Object.fromEntries(POLICY_FIELDS.map((f) => [f.name, Number(values[f.name])])) as unknown as LandlordPolicy),
  emergencyPhone: values.emergencyPhone.trim() === "" ? null : values.emergencyPhone.trim(),
});

export const updatePolicy = (policy: PolicyUpdate) => api.put<PolicyView>("/policy", policy);

export function useUpdatePolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePolicy,
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.current(), policy),
  });
}
