// The JSON body of each webhook event. What goes in is chosen for a landlord's own systems (its
// housing management, repairs contractor and reporting systems): identifiers, statuses, dates and the
// home's UPRN. Free text is left out — the tenant's description, staff reasons and notes, operatives'
// completion notes — and so are names and contact details: a receiving system that needs them asks the
// API with a key of its own, under that key's scopes. Integrators get facts to act on, not case files.
import type { CaseEventNotice } from "../cases/case-event-listener.js";
import type { WebhookEventType } from "../../../src/lib/contracts/webhooks.js";

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

/** The event-specific part of the body. */
function dataOf(notice: CaseEventNotice): Record<string, unknown> {
  const e = notice.event;
  switch (e.type) {
    case "case-created":
      return { channel: e.after.channel, awareAt: e.after.awareAt };
    case "status-changed":
      return { from: e.before.status, to: e.after.status };
    case "deadline-missed":
      return { stage: e.after.stage, dueAt: e.after.dueAt };
    case "work-order-scheduled":
      return {
        workOrderId: e.after.workOrderId,
        date: e.after.date,
        window: e.after.window,
        contractor: e.after.contractor,
        rescheduled: e.after.rescheduled,
      };
    case "work-order-completed":
      return {
        workOrderId: e.after.workOrderId,
        doneOn: e.after.doneOn ?? null,
        followOnWorkOrderId: e.after.followOnWorkOrderId ?? null,
      };
    default:
      return {};
  }
}

export interface WebhookBody {
  id: string;
  type: string;
  occurredAt: string;
  landlord: { id: number };
  case: {
    id: number;
    reference: string | null;
    status: string;
    hazardClass: string | null;
    home: { id: number; uprn: string | null };
    url: string;
  } | null;
  data: Record<string, unknown>;
}

export function caseEventBody(uid: string, type: WebhookEventType, notice: CaseEventNotice, appUrl: string): WebhookBody {
  const c = notice.case;
  return {
    id: uid,
    type,
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
    data: dataOf(notice),
  };
}
