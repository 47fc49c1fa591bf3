import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookEndpointDto } from "@/lib/contracts";
import { adminActionKeys, webhookKeys } from "@/lib/query-keys";
import type { WebhookEndpointPatch } from "@/lib/schemas/webhooks";

/** PATCH /api/webhooks/:id: switch an endpoint off or on, or change what it receives. */
export const updateWebhook = ({ id, patch }: { id: number; patch: WebhookEndpointPatch }) =>
  api.patch<WebhookEndpointDto>(`/webhooks/${id}`, patch);

export function useUpdateWebhook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateWebhook,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: webhookKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
