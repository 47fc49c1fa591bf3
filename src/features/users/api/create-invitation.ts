import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";
import type { InvitationSent } from "@/lib/contracts";
import { ROLES } from "@/lib/roles";
import { userKeys } from "@/lib/query-keys";

export const invitationFormSchema = z
  .object({
    name: z.string().trim().min(1, "Enter the person's name.").max(190, "A name can be at most 190 characters."),
    email: z
      .string()
      .trim()
      .min(1, "Enter their e-mail address.")
      .max(190, "An e-mail address can be at most 190 characters.")
      .pipe(z.email("Enter a valid e-mail address, like name@example.org.")),
    role: z.enum(ROLES, { error: "Choose a role." }),
    propertyId: z.number().int().positive().optional(),
    householdNotes: z.string().trim().max(2000, "Keep the notes under 2,000 characters.").optional(),
  })
  .refine((v) => v.role !== "tenant" || v.propertyId !== undefined, {
    path: ["propertyId"],
    message: "Choose the home this tenant lives in.",
  });
export type InvitationFormInput = z.infer<typeof invitationFormSchema>;

export type { InvitationSent };

export function createInvitation(input: InvitationFormInput): Promise<InvitationSent> {
  const tenant = input.role === "tenant";
  return api.post<InvitationSent>("/auth/invitations", {
    name: input.name,
    email: input.email,
    role: input.role,
    ...(tenant ? { propertyId: input.propertyId } : {}),
    ...(tenant && input.householdNotes ? { householdNotes: input.householdNotes } : {}),
  });
}

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
