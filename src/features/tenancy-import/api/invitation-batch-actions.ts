import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { tenancyImportKeys } from "@/lib/query-keys";

export type BatchAction = "pause" | "resume" | "cancel";

/** POST /api/tenancy-imports/:id/invitations/{pause,resume,cancel}. */
export const invitationBatchAction = ({ importId, action }: { importId: number; action: BatchAction }) =>
  api.post<void>(`/tenancy-imports/${importId}/invitations/${action}`);

export function useInvitationBatchAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: invitationBatchAction,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tenancyImportKeys.lists() }),
  });
}
