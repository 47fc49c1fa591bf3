import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

/** POST /api/auth/sign-in-unlock/request: e-mails a link that skips the sign-in wait (the same answer for any address). */
export const requestSignInLink = (email: string) => api.post<{ message: string }>("/auth/sign-in-unlock/request", { email });

/** POST /api/auth/sign-in-unlock: this browser may sign in to the link's account without waiting. */
export const openSignInLink = (token: string) => api.post<void>("/auth/sign-in-unlock", { token });

export function useRequestSignInLink() {
  return useMutation({ mutationFn: requestSignInLink });
}

export function useOpenSignInLink() {
  return useMutation({ mutationFn: openSignInLink });
}
