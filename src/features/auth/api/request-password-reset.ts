import { useMutation } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";

// The messages are keys of the `auth` text: the form shows them translated.
export const forgotPasswordSchema = z.object({
  email: z.string().trim().min(1, "auth:form.emailRequired").pipe(z.email("auth:form.emailInvalid")),
});
export type ForgotPasswordInput = z.infer<typeof forgotPasswordSchema>;

export const requestPasswordReset = (input: ForgotPasswordInput) => api.post<{ message: string }>("/auth/password-reset", input);

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
