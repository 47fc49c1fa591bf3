// Webhooks as admins see them: the endpoints they registered, and each delivery with its attempts.
// An endpoint's signing secret appears in exactly two replies (creation and rotation), never again.
import { z } from "zod";
import { CASE_STATUSES, CHANNELS } from "../schemas/case-report.js";
import { SLOT_WINDOWS } from "../schemas/work-orders.js";
import { hazardClass } from "./cases.js";
import { calendarDate, id, instant, pageOf } from "./common.js";
import { DEADLINE_STAGES } from "./inspections.js";

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

// ---- what a landlord's system receives: the JSON body of each event ------------------------------
// Identifiers, statuses, dates and the home's UPRN; no free text (the tenant's description, staff
// reasons and notes, completion notes) and no people's names or contact details. The server builds
// each body as `WebhookPayload` (server/modules/webhooks/webhook-payload.ts), and the OpenAPI
// document's `webhooks` section is generated from these schemas.

/** The case an event is about, as it stands after the event. */
export const webhookCase = z.object({
  id,
  reference: z.string().nullable(),
  status: z.enum(CASE_STATUSES),
  hazardClass: hazardClass.nullable(),
  home: z.object({ id, uprn: z.string().nullable().describe("The home's UPRN, when the landlord holds it.") }),
  url: z.string().describe("The case's page in Dewline (staff sign-in needed)."),
});

const envelope = <T extends string, D extends z.ZodType>(type: T, data: D, description: string) =>
  z
    .object({
      id: z.uuid().describe("The event's id: the same on every attempt and in the Dewline-Event-Id header. De-duplicate by it."),
      type: z.literal(type),
      occurredAt: instant,
      landlord: z.object({ id }),
      case: webhookCase,
      data,
    })
    .describe(description);

/** Each event type's body: a new event type fails to compile until its payload is written here. */
export const WEBHOOK_PAYLOADS = {
  "case.created": envelope(
    "case.created",
    z.object({ channel: z.enum(CHANNELS), awareAt: instant.describe("When the landlord became aware of the problem.") }),
    "A case was reported (by the tenant online, or logged by staff).",
  ),
  "case.status-changed": envelope(
    "case.status-changed",
    z.object({ from: z.enum(CASE_STATUSES), to: z.enum(CASE_STATUSES) }),
    "A case moved from one status to another (one event per step).",
  ),
  "case.deadline-missed": envelope(
    "case.deadline-missed",
    z.object({ stage: z.enum(DEADLINE_STAGES), dueAt: instant }),
    "A deadline of the case passed with its stage not done; sent once per case and stage.",
  ),
  "work-order.booked": envelope(
    "work-order.booked",
    z.object({
      workOrderId: id,
      date: calendarDate.describe("The London date of the visit."),
      window: z.enum(SLOT_WINDOWS),
      contractor: z.string().nullable().describe("The contractor firm's name, when a contractor does the work."),
      rescheduled: z.boolean(),
    }),
    "A work order's visit was booked, or booked again for another day or window.",
  ),
  "work-order.completed": envelope(
    "work-order.completed",
    z.object({
      workOrderId: id,
      doneOn: calendarDate.nullable().describe("The London date the work was done."),
      followOnWorkOrderId: id.nullable().describe("The order raised for follow-on work found, if any."),
    }),
    "A work order was completed.",
  ),
} as const satisfies Record<WebhookEventType, z.ZodType>;

/** The "send a test event" body: no case. */
export const webhookTestPayload = z
  .object({
    id: z.uuid(),
    type: z.literal(WEBHOOK_TEST_EVENT),
    occurredAt: instant,
    landlord: z.object({ id }),
    case: z.null(),
    data: z.object({ message: z.string() }),
  })
  .describe("A test event an admin sent to this one endpoint, whatever it subscribed to.");

/** The body of one event type, as the server builds it. */
export type WebhookPayloadOf<T extends WebhookEventType> = z.input<(typeof WEBHOOK_PAYLOADS)[T]>;
export type WebhookPayload = WebhookPayloadOf<WebhookEventType> | z.input<typeof webhookTestPayload>;
/** Any body Dewline sends. */
export const webhookPayload = z.union([webhookTestPayload, ...Object.values(WEBHOOK_PAYLOADS)]);

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
