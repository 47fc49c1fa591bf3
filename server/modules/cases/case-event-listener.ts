import type { EntityManager } from "typeorm";
import type { CaseStatus } from "../../../src/lib/domain/case-workflow.js";
import type { DeadlineStage, HazardClass } from "../../../src/lib/domain/deadlines.js";
import type { CaseEventPayload } from "./case-events.js";

/** What a listener is told about the case an event is on (read in the event's own transaction). */
export interface CaseFacts {
  id: number;
  organisationId: number;
  reference: string | null;
  /** The status after the event (for a status change, the status it moved to). */
  status: CaseStatus;
  hazardClass: HazardClass | null;
  propertyId: number;
  uprn: string | null;
}

/** A timeline event, or a deadline found missed by the triage figures (never a timeline entry). */
export type NoticedCaseEvent = CaseEventPayload | { type: "deadline-missed"; after: { stage: DeadlineStage; dueAt: string } };

export interface CaseEventNotice {
  event: NoticedCaseEvent;
  case: CaseFacts;
  occurredAt: Date;
}

/**
 * Told about chosen case events inside the transaction that records them, so whatever it writes
 * (e.g. webhook deliveries) commits or rolls back with the change. Wired in createServices; the
 * cases module knows only this interface, never who listens.
 */
export interface CaseEventListener {
  /** Whether this kind of event matters to it (asked before the case's facts are read). */
  wants(type: NoticedCaseEvent["type"]): boolean;
  caseEventRecorded(m: EntityManager, notice: CaseEventNotice): Promise<void>;
}
