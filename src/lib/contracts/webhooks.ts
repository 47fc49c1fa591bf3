// Webhooks as admins see them: the endpoints they registered, and each delivery with its attempts.
// An endpoint's signing secret appears in exactly two replies (creation and rotation), never again.
import { z } from "zod";
import { id, instant, pageOf } from "./common.js";

/** The case events a landlord's systems can be told about (our own names). */
export const WEBHOOK_EVENT_TYPES = [
  "case.created",
  "case.status-changed",
  "case.deadline-missed",
  "work-order.booked",
  "work-order.completed",
] as const;
export const webhookEventType = z.enum(WEBHOOK_EVENT_TYPES);
export type WebhookEventType = z.infer<typeof webhookEventType>;

/** The "send a test event" delivery's type: sent to one endpoint on request, never subscribed to. */
export const WEBHOOK_TEST_EVENT = "webhook.test" as const;

/** pending: waiting for its first try or a retry; sending: being sent now; delivered: the receiver answered 2xx; failed: given up. */
export const WEBHOOK_DELIVERY_STATUSES = ["pending", "sending", "delivered", "failed"] as const;
export const webhookDeliveryStatus = z.enum(WEBHOOK_DELIVERY_STATUSES);
export type WebhookDeliveryStatus = z.infer<typeof webhookDeliveryStatus>;

export const webhookEndpointResponse = z.object({
  id,
  url: z.string(),
  description: z.string(),
  eventTypes: z.array(webhookEventType),
  active: z.boolean(),
  createdAt: instant,
  /** When the secret was last replaced; the one before it still signs too until previousSecretUntil. */
  secretRotatedAt: instant.nullable(),
  previousSecretUntil: instant.nullable(),
  /** Deliveries waiting (pending or being sent) and given up (failed). */
  pending: z.number().int().min(0),
  failed: z.number().int().min(0),
});
export type WebhookEndpointDto = z.infer<typeof webhookEndpointResponse>;
export const webhookEndpointListResponse = z.object({ items: z.array(webhookEndpointResponse) });

/** Creation and rotation: the endpoint and its new signing secret, shown this once. */
export const webhookSecretResponse = z.object({ endpoint: webhookEndpointResponse, secret: z.string() });
export type WebhookSecretDto = z.infer<typeof webhookSecretResponse>;

export const webhookAttemptResponse = z.object({
  at: instant,
  /** The receiver's HTTP status, or null when there was none (timeout, refused connection…). */
  statusCode: z.number().int().nullable(),
  error: z.string().nullable(),
  durationMs: z.number().int().min(0),
});

export const webhookDeliveryResponse = z.object({
  id,
  eventId: z.string(),
  eventType: z.union([webhookEventType, z.literal(WEBHOOK_TEST_EVENT)]),
  occurredAt: instant,
  case: z.object({ id, reference: z.string().nullable() }).nullable(),
  status: webhookDeliveryStatus,
  attempts: z.number().int().min(0),
  nextAttemptAt: instant.nullable(),
  deliveredAt: instant.nullable(),
  /** Every attempt, newest first. */
  history: z.array(webhookAttemptResponse),
});
export type WebhookDeliveryDto = z.infer<typeof webhookDeliveryResponse>;
export const webhookDeliveryPageResponse = pageOf(webhookDeliveryResponse);
export type WebhookDeliveryPage = z.infer<typeof webhookDeliveryPageResponse>;
