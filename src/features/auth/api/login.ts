import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api, setCsrfToken } from "@/lib/api-client";
import type { LoginResponse } from "@/lib/contracts";
import type { User } from "../roles";
import { authKeys } from "@/lib/query-keys";

// The messages are keys of the `auth` text (src/locales/*/auth.json): the form shows them translated.
export const signInSchema = z.object({
  email: z.string().trim().min(1, "auth:form.emailRequired").pipe(z.email("auth:form.emailInvalid")),
  password: z.string().min(1, "auth:form.passwordRequired"),
});
export type SignInInput = z.infer<typeof signInSchema>;

export async function login(input: SignInInput): Promise<User> {
  const res = await api.post<LoginResponse>("/auth/login", input);
  // Signing in starts a new session with a new token: the old one is no use any more.
  setCsrfToken(res.csrfToken);
  return res.user;
}

export function useLogin(options: { onSuccess?: (user: User) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...authKeys.all, "login"],
    mutationFn: login,
    onSuccess: (user) => {
      // Anything cached belonged to the signed-out visitor (or someone else): start clean.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
      options.onSuccess?.(user);
    },
  });
}
