import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookSecretDto } from "@/lib/contracts";
import { webhookKeys } from "@/lib/query-keys";

/** POST /api/webhooks/:id/secret: a new signing secret, answered this once (the old one signs too for 24 hours). */
export const rotateWebhookSecret = (id: number) => api.post<WebhookSecretDto>(`/webhooks/${id}/secret`);

export function useRotateWebhookSecret() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: rotateWebhookSecret,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: webhookKeys.lists() }),
  });
}
