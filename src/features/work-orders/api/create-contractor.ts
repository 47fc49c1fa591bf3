import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";
import type { Contractor, ContractorInput } from "./types";
import { contractorKeys } from "@/lib/query-keys";

/** The same rules as the server's (POST /api/contractors), with messages for the form. */
export const contractorFormSchema = z.object({
  name: z.string().trim().min(2, "Enter the contractor's name.").max(190, "A name can be at most 190 characters."),
  email: z
    .string()
    .trim()
    .min(1, "Enter an e-mail address the contractor reads.")
    .max(190, "An e-mail address can be at most 190 characters.")
    .pipe(z.email("Enter a valid e-mail address, like name@example.org.")),
  phone: z
    .string()
    .trim()
    .max(40, "A phone number can be at most 40 characters.")
    .refine((v) => v === "" || /^[+()\d\s-]{6,}$/.test(v), "Enter a phone number using digits, spaces, +, ( ) or -."),
  trade: z.string().trim().max(100, "Keep the trade under 100 characters."),
});
export type ContractorFormInput = z.infer<typeof contractorFormSchema>;

export function createContractor(input: ContractorFormInput): Promise<Contractor> {
  const body: ContractorInput = { name: input.name, email: input.email };
  if (input.phone) body.phone = input.phone;
  if (input.trade) body.trade = input.trade;
  return api.post<Contractor>("/contractors", body);
}

export function useCreateContractor() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createContractor,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: contractorKeys.all }),
  });
}
