import type { WebhookDeliveryDto, WebhookEndpointDto, WebhookEventType } from "../../../src/lib/contracts/webhooks.js";
import type { DeliveryWithHistory, EndpointCounts } from "./webhook.service.js";
import type { WebhookEndpoint } from "./webhook-endpoint.entity.js";

/** An endpoint as its admins see it: never its secret. */
export const toWebhookEndpointDto = (e: WebhookEndpoint, counts: EndpointCounts): WebhookEndpointDto => ({
  id: e.id,
  url: e.url,
  description: e.description,
  eventTypes: e.eventTypes,
  active: e.active,
  createdAt: e.createdAt.toISOString(),
  secretRotatedAt: e.secretRotatedAt?.toISOString() ?? null,
  previousSecretUntil: e.previousSecretUntil?.toISOString() ?? null,
  pending: counts.pending,
  failed: counts.failed,
});

export const toWebhookDeliveryDto = ({ delivery: d, event, attempts }: DeliveryWithHistory): WebhookDeliveryDto => ({
  id: d.id,
  eventId: event.uid,
  eventType: event.type as WebhookEventType | "webhook.test",
  occurredAt: event.occurredAt.toISOString(),
  case: event.caseId === null ? null : { id: event.caseId, reference: event.caseReference },
  status: d.status,
  attempts: d.attempts,
  nextAttemptAt: d.status === "pending" ? (d.nextAttemptAt?.toISOString() ?? null) : null,
  deliveredAt: d.deliveredAt?.toISOString() ?? null,
  history: attempts.map((a) => ({
    at: a.attemptedAt.toISOString(),
    statusCode: a.statusCode,
    error: a.error,
    durationMs: a.durationMs,
  })),
});
