import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WebhookDeliveryPage } from "@/lib/contracts";
import { webhookKeys } from "@/lib/query-keys";

export const DELIVERIES_PAGE_SIZE = 20;

/** GET /api/webhooks/:id/deliveries: newest first, each with every attempt. */
export const getWebhookDeliveries = (endpointId: number, page: number, signal?: AbortSignal) =>
  api.get<WebhookDeliveryPage>(`/webhooks/${endpointId}/deliveries`, {
    signal,
    query: { page, pageSize: DELIVERIES_PAGE_SIZE },
  });

export const webhookDeliveriesQueryOptions = (endpointId: number, page: number) =>
  queryOptions({
    queryKey: webhookKeys.deliveries(endpointId, page),
    queryFn: ({ signal }) => getWebhookDeliveries(endpointId, page, signal),
    placeholderData: keepPreviousData,
  });

export function useWebhookDeliveries(endpointId: number, page: number) {
  return useQuery(webhookDeliveriesQueryOptions(endpointId, page));
}
