import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookSecretDto } from "@/lib/contracts";
import { adminActionKeys, webhookKeys } from "@/lib/query-keys";

/** POST /api/webhooks/:id/secret: a new signing secret, answered this once (the old one signs too for 24 hours). */
export const rotateWebhookSecret = (id: number) => api.post<WebhookSecretDto>(`/webhooks/${id}/secret`);

export function useRotateWebhookSecret() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: rotateWebhookSecret,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: webhookKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
