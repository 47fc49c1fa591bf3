import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookEndpointDto } from "@/lib/contracts";
import { webhookKeys } from "@/lib/query-keys";

/** GET /api/webhooks: the landlord's endpoints, never their secrets. */
export const getWebhooks = (signal?: AbortSignal) => api.get<{ items: WebhookEndpointDto[] }>("/webhooks", { signal });

export const webhooksQueryOptions = () =>
  queryOptions({
    queryKey: webhookKeys.lists(),
    queryFn: ({ signal }) => getWebhooks(signal),
  });

export function useWebhooks() {
  return useQuery(webhooksQueryOptions());
}
