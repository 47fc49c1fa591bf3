import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const resetPassword = (input: { token: string; password: string }) =>
  api.post<void>("/auth/password-reset/confirm", input);

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
