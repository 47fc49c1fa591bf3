import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Me, MyLanguage } from "@/lib/contracts";
import { authKeys } from "@/lib/query-keys";
import type { MyLanguageInput } from "@/lib/schemas/language";

/** PUT /api/me/language: the signed-in tenant's language, kept on their account (e-mails and texts follow it). */
export function useSetMyLanguage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...authKeys.me(), "language"],
    mutationFn: (input: MyLanguageInput) => api.put<MyLanguage>("/me/language", input),
    onSuccess: ({ language }) => queryClient.setQueryData<Me | null>(authKeys.me(), (me) => (me ? { ...me, language } : me)),
  });
}
