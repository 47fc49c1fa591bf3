import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { OutboxItem } from "@/lib/contracts";
import { caseKeys, outboxKeys } from "@/lib/query-keys";

/** POST /api/outbox/:id/resend: the e-mail goes out again (a new copy), in the background. */
export const resendEmail = (outboxId: number) => api.post<OutboxItem>(`/outbox/${outboxId}/resend`);

export function useResendEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendEmail,
    onSuccess: (item) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: outboxKeys.lists() }),
        item.case ? queryClient.invalidateQueries({ queryKey: caseKeys.events(item.case.id) }) : undefined,
      ]),
  });
}
