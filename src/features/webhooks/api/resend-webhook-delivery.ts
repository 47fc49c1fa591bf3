import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookDeliveryDto } from "@/lib/contracts";
import { webhookKeys } from "@/lib/query-keys";

/** POST /api/webhooks/:id/deliveries/:deliveryId/resend: the same event, with the same id, goes again. */
export const resendWebhookDelivery = ({ endpointId, deliveryId }: { endpointId: number; deliveryId: number }) =>
  api.post<WebhookDeliveryDto>(`/webhooks/${endpointId}/deliveries/${deliveryId}/resend`);

export function useResendWebhookDelivery() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendWebhookDelivery,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: webhookKeys.all }),
  });
}
