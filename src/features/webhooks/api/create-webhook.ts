import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookSecretDto } from "@/lib/contracts";
import { adminActionKeys, webhookKeys } from "@/lib/query-keys";
import type { WebhookEndpointInput } from "@/lib/schemas/webhooks";

/** POST /api/webhooks: the new endpoint and its signing secret, answered this once. */
export const createWebhook = (input: WebhookEndpointInput) => api.post<WebhookSecretDto>("/webhooks", input);

export function useCreateWebhook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createWebhook,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: webhookKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
