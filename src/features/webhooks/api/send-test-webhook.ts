import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookDeliveryDto } from "@/lib/contracts";
import { webhookKeys } from "@/lib/query-keys";

/** POST /api/webhooks/:id/test: a test event to this endpoint. */
export const sendTestWebhook = (id: number) => api.post<WebhookDeliveryDto>(`/webhooks/${id}/test`);

export function useSendTestWebhook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendTestWebhook,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: webhookKeys.all }),
  });
}
