// The JSON body of each webhook event. What goes in is chosen for a landlord's own systems (its
// housing management, repairs contractor and reporting systems): identifiers, statuses, dates and the
// home's UPRN. Free text is left out — the tenant's description, staff reasons and notes, operatives'
// completion notes — and so are names and contact details: a receiving system that needs them asks the
// API with a key of its own, under that key's scopes. Integrators get facts to act on, not case files.
// The shapes are the contract's (WEBHOOK_PAYLOADS in src/lib/contracts/webhooks.ts), which the OpenAPI
// document publishes too.
import type { CaseEventNotice } from "../cases/case-event-listener.js";
import type { Channel } from "../../../src/lib/schemas/case-report.js";
import type { WebhookEventType, WebhookPayload, WebhookPayloadOf } from "../../../src/lib/contracts/webhooks.js";

/** The webhook event type a noticed case event becomes, if any. */
export function webhookTypeOf(type: CaseEventNotice["event"]["type"]): WebhookEventType | null {
  switch (type) {
    case "case-created":
      return "case.created";
    case "status-changed":
      return "case.status-changed";
    case "deadline-missed":
      return "case.deadline-missed";
    case "work-order-scheduled":
      return "work-order.booked";
    case "work-order-completed":
      return "work-order.completed";
    default:
      return null;
  }
}

type Envelope = Omit<WebhookPayloadOf<WebhookEventType>, "id" | "type" | "data">;

/** The body of a noticed case event that has a webhook event type, or null for one that has none. */
export function caseEventBody(uid: string, notice: CaseEventNotice, appUrl: string): WebhookPayload | null {
  const c = notice.case;
  // The key order is the document's: id and type first.
  const base: Envelope = {
    occurredAt: notice.occurredAt.toISOString(),
    landlord: { id: c.organisationId },
    case: {
      id: c.id,
      reference: c.reference,
      status: c.status,
      hazardClass: c.hazardClass,
      home: { id: c.propertyId, uprn: c.uprn },
      url: `${appUrl}/cases/${c.id}`,
    },
  };
  const e = notice.event;
  switch (e.type) {
    case "case-created":
      return { id: uid, type: "case.created", ...base, data: { channel: e.after.channel as Channel, awareAt: e.after.awareAt } };
    case "status-changed":
      return { id: uid, type: "case.status-changed", ...base, data: { from: e.before.status, to: e.after.status } };
    case "deadline-missed":
      return { id: uid, type: "case.deadline-missed", ...base, data: { stage: e.after.stage, dueAt: e.after.dueAt } };
    case "work-order-scheduled":
      return {
        id: uid,
        type: "work-order.booked",
        ...base,
        data: {
          workOrderId: e.after.workOrderId,
          date: e.after.date,
          window: e.after.window,
          contractor: e.after.contractor,
          rescheduled: e.after.rescheduled,
        },
      };
    case "work-order-completed":
      return {
        id: uid,
        type: "work-order.completed",
        ...base,
        data: {
          workOrderId: e.after.workOrderId,
          doneOn: e.after.doneOn ?? null,
          followOnWorkOrderId: e.after.followOnWorkOrderId ?? null,
        },
      };
    default:
      return null;
  }
}
