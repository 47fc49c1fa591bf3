import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { InvitationCreated } from "@/lib/contracts";
import { userKeys } from "@/lib/query-keys";

/** POST /api/auth/invitations/:userId/resend: a new e-mail with a new link; the old link stops working. */
export const resendInvitation = (userId: number) => api.post<InvitationCreated>(`/auth/invitations/${userId}/resend`);

/** POST /api/auth/invitations/:userId/cancel: the link stops working and the account is marked cancelled. */
export const cancelInvitation = (userId: number) => api.post<void>(`/auth/invitations/${userId}/cancel`);

function useInvitationAction<T>(action: (userId: number) => Promise<T>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: action,
    onSuccess: (_result, userId) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: userKeys.history(userId) }),
      ]),
  });
}

export const useResendInvitation = () => useInvitationAction(resendInvitation);
export const useCancelInvitation = () => useInvitationAction(cancelInvitation);
