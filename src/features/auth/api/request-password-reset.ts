import { useMutation } from "@tanstack/react-query";
import { z } from "zod";
import { api } from "@/lib/api-client";

export const forgotPasswordSchema = z.object({
  email: z
    .string()
    .trim()
    .min(1, "Enter your e-mail address.")
    .pipe(z.email("Enter a valid e-mail address, like name@example.org.")),
});
export type ForgotPasswordInput = z.infer<typeof forgotPasswordSchema>;

export const requestPasswordReset = (input: ForgotPasswordInput) => api.post<{ message: string }>("/auth/password-reset", input);

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
