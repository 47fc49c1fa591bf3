import type { CaseStatus } from "../../../src/lib/domain/case-workflow.js";
import type { DeadlineStage, HazardClass } from "../../../src/lib/domain/deadlines.js";
import type { SlotWindow } from "../../../src/lib/schemas/work-orders.js";

interface ComplaintEventBase {
  complaintId: number;
  stage: 1 | 2;
  /** Staff only. */
  note: string | null;
}

/** The letter as the tenant was sent it (its outbox row is the event's `outboxId`). */
interface ComplaintLetterSent {
  subject: string;
  body: string;
}

interface ComplaintRemedy {
  apology: boolean;
  apologyText: string | null;
  putRight: string | null;
  compensationOfferedPence: number | null;
  compensationOfferedOn: string | null;
  compensationAcceptedOn: string | null;
  compensationPaidPence: number | null;
  compensationPaidOn: string | null;
}

/**
 * Every kind of entry on a case's timeline, with its payload. `case_events` stores `type`, `before`
 * and `after` as they are here (JSON); the union is what the code may write.
 */
export type CaseEventPayload =
  | {
      type: "case-created";
      after: {
        reference: string | null;
        status: CaseStatus;
        channel: string;
        awareAt: string;
        description: string;
        locations: string[];
        observations: string[];
        roomIds: number[];
        since: string | null;
        area: string | null;
        vulnerability: string[] | null;
      };
    }
  | { type: "status-changed"; before: { status: CaseStatus }; after: { status: CaseStatus; reason: string | null } }
  | { type: "assignee-changed"; before: { assigneeId: number | null }; after: { assigneeId: number | null } }
  | {
      type: "hazard-classified";
      before: { hazardClass: HazardClass | null; reason: string | null };
      after: { hazardClass: HazardClass | null; reason: string | undefined };
    }
  | { type: "email-queued"; after: { outboxId: number; to: string; template: string } }
  /** Staff sent an e-mail about the case again from the outbox (the actor is who asked). */
  | { type: "email-resent"; after: { outboxId: number; to: string; template: string; subject: string } }
  /** A text message to the tenant was queued (sms module): its outbox row, what it said, the number's last digits. */
  | { type: "text-queued"; after: { outboxSmsId: number; kind: string; body: string; numberEnding: string } }
  /** The tenant has texts off, so this went by e-mail only. */
  | { type: "text-not-sent"; after: { kind: string; reason: "texts-off" } }
  | { type: "tenant-got-worse"; after: { note: string } }
  | { type: "photos-added"; after: { photoIds: number[]; workOrderId: number | null } }
  | { type: "readings-added"; after: { imported: number; duplicates: number; roomIds: number[]; roomId: number | undefined } }
  | {
      type: "readings-imported";
      after: { importId: number; fileName: string; roomId: number; imported: number; duplicates: number; rejected: number };
    }
  | {
      type: "hhsrs-assessed";
      before: { version: number; band: string; category: number } | null;
      after: { version: number; score: number; band: string; category: number };
    }
  | { type: "inspection-recorded"; after: { inspectionId: number; inspectedAt: string; cause: string; mouldExtent: string } }
  | { type: "summary-sent"; after: { summaryId: number; body: string; outboxId: number } }
  | { type: "internal-note"; after: { body: string } }
  | { type: "message-to-tenant"; after: { body: string; outboxId?: number } }
  /** The tenant wrote to the landlord (conversation module), with photos already on the case. */
  | { type: "message-from-tenant"; after: { body: string; photoIds: number[] } }
  | {
      type: "work-order-created";
      after: { workOrderId: number; type: string; description: string; targetDate: string; priority: string };
    }
  | {
      type: "work-order-scheduled";
      before: { date: string; window: SlotWindow } | null;
      after: {
        workOrderId: number;
        date: string;
        window: SlotWindow;
        assignee: string | null;
        contractor: string | null;
        rescheduled: boolean;
      };
    }
  | {
      type: "booking-confirmed" | "booking-change-requested";
      after: { workOrderId: number; date: string; window: SlotWindow; reason: string | null };
    }
  | {
      type: "work-order-completed";
      after: {
        workOrderId: number;
        note: string;
        followOn: string | null;
        /** The London date the work was done, as entered (older events have none). */
        doneOn?: string;
        /** Why it was done before the booked day, when it was. */
        earlyReason?: string | null;
        /** The order raised for the follow-on work found. */
        followOnWorkOrderId?: number | null;
      };
    }
  | { type: "work-order-cancelled"; after: { workOrderId: number; reason: string } }
  | { type: "monitoring-started"; after: { worksDoneAt: string; endsAt: string; days: number } }
  /** Staff made the case's evidence pack: its content hash (EVIDENCE_PACK_DEFINITION), pages and file name. */
  | { type: "evidence-pack-made"; after: { sha256: string; pages: number; fileName: string } }
  /** A sensor alert on one of the case's home's rooms (sensor-watch module; staff only). */
  | {
      type: "sensor-alert";
      after: {
        alertId: number;
        rule: string;
        roomId: number;
        roomName: string;
        raisedAt: string;
        hoursAt80: number;
        hoursCondensing: number;
        condensingDays: number;
        mouldIndex: number;
        basis: string;
      };
    }
  /** Staff said why a deadline stage was missed (staff only). */
  | { type: "missed-deadline-explained"; before: { reason: string | null }; after: { stage: DeadlineStage; reason: string } }
  /** Complaints (complaints module). `note` is staff-only in every complaint event; `letter` is what the tenant was sent. */
  | {
      type: "complaint-raised";
      after: { complaintId: number; description: string; onBehalf: boolean; acknowledgeDueAt: string };
    }
  | {
      type: "complaint-acknowledged";
      after: ComplaintEventBase & { respondDueAt: string; letter: ComplaintLetterSent | null; outboxId?: number };
    }
  | {
      type: "complaint-extended";
      after: ComplaintEventBase & {
        workingDays: number;
        reason: string;
        respondDueAt: string;
        letter: ComplaintLetterSent | null;
        outboxId?: number;
      };
    }
  | {
      type: "complaint-responded";
      after: ComplaintEventBase & { final: boolean; response: string; letter: ComplaintLetterSent | null; outboxId?: number };
    }
  | { type: "complaint-escalated"; after: ComplaintEventBase & { reason: string; acknowledgeDueAt: string } }
  | { type: "complaint-closed"; after: ComplaintEventBase }
  | {
      type: "complaint-remedy-changed";
      before: ComplaintRemedy;
      after: ComplaintRemedy & { complaintId: number; note: string | null };
    }
  | {
      type: "fix-verified";
      /** override: why "fix effective" was recorded without enough readings after the works (staff only). */
      /** hoursAt80PerDayChange: the readings' change in hours a day at ≥ 80 % surface RH, after less before (mean over rooms with both), for the dashboard's "what works"; null without readings. */
      after: { effective: boolean; note: string; override?: string | null; hoursAt80PerDayChange?: number | null };
    };

export type CaseEventType = CaseEventPayload["type"];

/** The payload of one kind of event. */
export type CaseEventOf<T extends CaseEventType> = Extract<CaseEventPayload, { type: T }>;

/** A new timeline entry: who, on which case, and what. */
export type NewCaseEvent = { caseId: number; actorId: number | null } & CaseEventPayload;

/** A stored row read back as its kind (the row's JSON is what was written through NewCaseEvent). */
export function asCaseEvent<T extends CaseEventType>(
  row: { type: string; before: unknown; after: unknown },
  type: T,
): CaseEventOf<T> | null {
  return row.type === type ? ({ type, before: row.before, after: row.after } as unknown as CaseEventOf<T>) : null;
}
