// The clocks of a formal complaint: two stages, each with an acknowledgement and a response due.
// Timeframes are per-landlord policy; the default is TRADE.md §5 (the complaint-handling timeframes,
// marked there [M, from memory: verify the current edition before citing]).
//
// Rules (TRADE.md §5 unless marked ours):
// - Stage 1 starts when the complaint is raised, stage 2 when it is escalated. Acknowledge within
//   `acknowledgeWorkingDays` working days of the start; respond within `respondWorkingDays` working
//   days of the acknowledgement.
// - Until the acknowledgement is recorded, the response clock is counted from the acknowledgement's
//   due day (ours: the latest a timely acknowledgement could be, so the date shown never moves
//   earlier; once acknowledged it is counted from the real day).
// - One extension per stage, of 1 to `extensionMaxWorkingDays` working days, added to the response
//   due date (the acknowledgement is not extended).
// - Working days and the end of a day as in working-days.ts (Europe/London, England-and-Wales bank
//   holidays, day 0 = the day of the event, due at 23:59:59.999 local).
// - State: done at or before due → met; done after → missed; not done and now past due → missed;
//   otherwise pending (as in deadlines.ts). A stage not started is not-started.
import { isAbsent } from "./guards.js";
import { addWorkingDays } from "./working-days.js";

export interface ComplaintPolicy {
  stage1AcknowledgeWorkingDays: number;
  stage1RespondWorkingDays: number;
  stage2AcknowledgeWorkingDays: number;
  stage2RespondWorkingDays: number;
  /** The most one extension of a stage's response may add. */
  extensionMaxWorkingDays: number;
}

/**
 * TRADE.md §5, the complaint-handling timeframes [M, from memory: verify the current edition of the
 * Housing Ombudsman's Complaint Handling Code before relying on them].
 */
export const COMPLAINT_HANDLING_DEFAULT_POLICY: Readonly<ComplaintPolicy> = Object.freeze({
  stage1AcknowledgeWorkingDays: 5,
  stage1RespondWorkingDays: 10,
  stage2AcknowledgeWorkingDays: 5,
  stage2RespondWorkingDays: 20,
  extensionMaxWorkingDays: 10,
});

export type ComplaintStageNumber = 1 | 2;
export type ComplaintClockState = "pending" | "met" | "missed" | "not-started";

export interface ComplaintStageFacts {
  /** Raised (stage 1) or escalated (stage 2); null while the stage has not started. */
  startedAt: Date | null;
  acknowledgedAt?: Date | null;
  /** The working days of the stage's one extension, when granted. */
  extensionWorkingDays?: number | null;
  respondedAt?: Date | null;
}

export interface ComplaintStageClock {
  stage: ComplaintStageNumber;
  acknowledgeDueAt: Date | null;
  acknowledgedAt: Date | null;
  acknowledge: ComplaintClockState;
  /** Including the extension, when there is one. */
  respondDueAt: Date | null;
  respondedAt: Date | null;
  respond: ComplaintClockState;
  extensionWorkingDays: number | null;
}

/** One stage's two clocks at `now`. */
export function complaintStageClock(
  stage: ComplaintStageNumber,
  facts: ComplaintStageFacts,
  policy: ComplaintPolicy,
  now: Date,
): ComplaintStageClock {
  const startedAt = facts.startedAt ?? null;
  const acknowledgedAt = facts.acknowledgedAt ?? null;
  const respondedAt = facts.respondedAt ?? null;
  const extension = isAbsent(facts.extensionWorkingDays) ? null : facts.extensionWorkingDays;
  if (extension !== null && (!Number.isInteger(extension) || extension < 1)) {
    throw new RangeError(`extensionWorkingDays must be a whole number ≥ 1, got ${String(extension)}`);
  }
  if (startedAt === null) {
    return {
      stage,
      acknowledgeDueAt: null,
      acknowledgedAt: null,
      acknowledge: "not-started",
      respondDueAt: null,
      respondedAt: null,
      respond: "not-started",
      extensionWorkingDays: null,
    };
  }
  const [ackDays, respondDays] =
    stage === 1
      ? [policy.stage1AcknowledgeWorkingDays, policy.stage1RespondWorkingDays]
      : [policy.stage2AcknowledgeWorkingDays, policy.stage2RespondWorkingDays];
  const acknowledgeDueAt = addWorkingDays(startedAt, ackDays);
  const respondFrom = acknowledgedAt ?? acknowledgeDueAt;
  const respondDueAt = addWorkingDays(respondFrom, respondDays + (extension ?? 0));
  return {
    stage,
    acknowledgeDueAt,
    acknowledgedAt,
    acknowledge: stateOf(acknowledgeDueAt, acknowledgedAt, now),
    respondDueAt,
    respondedAt,
    // A response is also the acknowledgement's latest moment (ours: responding at once acknowledges too).
    respond: stateOf(respondDueAt, respondedAt, now),
    extensionWorkingDays: extension,
  };
}

export interface ComplaintClockFacts {
  raisedAt: Date;
  stage1: Omit<ComplaintStageFacts, "startedAt">;
  /** Null while the complaint has not been escalated. */
  stage2: ComplaintStageFacts | null;
  policy: ComplaintPolicy;
  now: Date;
}

/** Both stages' clocks, stage 1 first. */
export function complaintClocks(facts: ComplaintClockFacts): [ComplaintStageClock, ComplaintStageClock] {
  return [
    complaintStageClock(1, { ...facts.stage1, startedAt: facts.raisedAt }, facts.policy, facts.now),
    complaintStageClock(2, facts.stage2 ?? { startedAt: null }, facts.policy, facts.now),
  ];
}

function stateOf(dueAt: Date, doneAt: Date | null, now: Date): ComplaintClockState {
  if (doneAt) return doneAt.getTime() <= dueAt.getTime() ? "met" : "missed";
  return now.getTime() > dueAt.getTime() ? "missed" : "pending";
}
