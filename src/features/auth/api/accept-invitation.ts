import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { authKeys } from "@/lib/query-keys";

export const acceptInvitation = (input: { token: string; password: string }) => api.post<void>("/auth/invitations/accept", input);

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (_data, { token }) => queryClient.removeQueries({ queryKey: authKeys.invitation(token) }),
  });
}
