// Statutory deadlines for one case, from when the landlord became aware and what has been done.
// Timeframes are per-landlord policy; the default is TRADE.md §5 (England social housing).
//
// Rules (TRADE.md §5 unless marked ours):
// - make-safe: emergency hazards only, due awareAt + emergencyMakeSafeHours elapsed hours (a
//   clock change does not stretch or shorten the 24 hours).
// - investigate: emergency, within the same 24 hours ("investigate and make safe within 24
//   hours"); significant, within investigateWorkingDays working days of becoming aware. An
//   unclassified case (null) is treated as significant until classified (ours, the prudent
//   reading: the clock runs from awareness, not from triage).
// - summary, safety-work, supplementary-work: run from the end of the investigation; while it
//   is open their dueAt is null and they are pending. Summary: summaryWorkingDays working days;
//   safety work begun: safetyWorkWorkingDays working days; supplementary preventative work
//   begun: supplementaryWorkWeeks weeks, taken as calendar days to the end of the London day
//   (ours, matching the working-day stages). We track only the 12-week outer limit, not the
//   "within 5 working days where reasonably practicable" that precedes it (ours).
// - For an emergency hazard (ours, prudent: §5 lists these stages under significant hazards
//   only; verify against the regulations): the summary and supplementary work apply as for a
//   significant hazard; safety-work is not-applicable because make-safe is that work.
// - not-significant (ours): no statutory stage applies; investigate is met once an
//   investigation end is recorded, pending otherwise, with no due date; the rest not-applicable.
// - State: done at or before due → met; done after → missed; not done and now past due → missed;
//   otherwise pending. Done with no due date (not yet due, or not-applicable) → met, or
//   not-applicable for a stage that does not apply. Recorded times are passed through as doneAt.
// - Working days and the end of a day are as in working-days.ts (Europe/London, day 0 = the day
//   of the event, end of day 23:59:59.999 local).
import { isAbsent } from "./guards.js";
import { addCalendarDays, addWorkingDays } from "./working-days.js";

export const HAZARD_CLASSES = ["emergency", "significant", "not-significant"] as const;
export type HazardClass = (typeof HAZARD_CLASSES)[number];

export const DEADLINE_STAGES = ["make-safe", "investigate", "summary", "safety-work", "supplementary-work"] as const;
export type DeadlineStage = (typeof DEADLINE_STAGES)[number];

export type DeadlineState = "pending" | "met" | "missed" | "not-applicable";

export interface DeadlinePolicy {
  emergencyMakeSafeHours: number;
  investigateWorkingDays: number;
  summaryWorkingDays: number;
  safetyWorkWorkingDays: number;
  supplementaryWorkWeeks: number;
}

/** TRADE.md §5: the England social-housing default timeframes. */
export const ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY: Readonly<DeadlinePolicy> = Object.freeze({
  emergencyMakeSafeHours: 24,
  investigateWorkingDays: 10,
  summaryWorkingDays: 3,
  safetyWorkWorkingDays: 5,
  supplementaryWorkWeeks: 12,
});

export interface DeadlineFacts {
  /** null while the case is not yet classified: treated as significant. */
  hazardClass: HazardClass | null;
  awareAt: Date;
  investigationEndedAt?: Date | null;
  summarySentAt?: Date | null;
  madeSafeAt?: Date | null;
  safetyWorkStartedAt?: Date | null;
  supplementaryWorkStartedAt?: Date | null;
  now: Date;
  policy: DeadlinePolicy;
}

export interface Deadline {
  stage: DeadlineStage;
  dueAt: Date | null;
  doneAt: Date | null;
  state: DeadlineState;
}

const HOUR_MS = 3_600_000;

/** All five stages, always in DEADLINE_STAGES order. */
export function computeDeadlines(facts: DeadlineFacts): Deadline[] {
  const policy = requirePolicy(facts.policy);
  const awareAt = requireDate(facts.awareAt, "awareAt");
  const now = requireDate(facts.now, "now");
  const investigationEndedAt = optionalDate(facts.investigationEndedAt, "investigationEndedAt");
  const summarySentAt = optionalDate(facts.summarySentAt, "summarySentAt");
  const madeSafeAt = optionalDate(facts.madeSafeAt, "madeSafeAt");
  const safetyWorkStartedAt = optionalDate(facts.safetyWorkStartedAt, "safetyWorkStartedAt");
  const supplementaryWorkStartedAt = optionalDate(facts.supplementaryWorkStartedAt, "supplementaryWorkStartedAt");
  const hazardClass = facts.hazardClass ?? "significant";

  const stage = (name: DeadlineStage, dueAt: Date | null, doneAt: Date | null): Deadline => ({
    stage: name,
    dueAt,
    doneAt,
    state: stateOf(dueAt, doneAt, now),
  });
  const notApplicable = (name: DeadlineStage, doneAt: Date | null): Deadline => ({
    stage: name,
    dueAt: null,
    doneAt,
    state: "not-applicable",
  });

  if (hazardClass === "not-significant") {
    return [
      notApplicable("make-safe", madeSafeAt),
      stage("investigate", null, investigationEndedAt),
      notApplicable("summary", summarySentAt),
      notApplicable("safety-work", safetyWorkStartedAt),
      notApplicable("supplementary-work", supplementaryWorkStartedAt),
    ];
  }

  const emergency = hazardClass === "emergency";
  const emergencyDueAt = new Date(awareAt.getTime() + policy.emergencyMakeSafeHours * HOUR_MS);
  const afterInvestigation = (due: (endedAt: Date) => Date): Date | null =>
    investigationEndedAt ? due(investigationEndedAt) : null;

  return [
    emergency ? stage("make-safe", emergencyDueAt, madeSafeAt) : notApplicable("make-safe", madeSafeAt),
    stage(
      "investigate",
      emergency ? emergencyDueAt : addWorkingDays(awareAt, policy.investigateWorkingDays),
      investigationEndedAt,
    ),
    stage(
      "summary",
      afterInvestigation((t) => addWorkingDays(t, policy.summaryWorkingDays)),
      summarySentAt,
    ),
    emergency
      ? notApplicable("safety-work", safetyWorkStartedAt)
      : stage(
          "safety-work",
          afterInvestigation((t) => addWorkingDays(t, policy.safetyWorkWorkingDays)),
          safetyWorkStartedAt,
        ),
    stage(
      "supplementary-work",
      afterInvestigation((t) => addCalendarDays(t, policy.supplementaryWorkWeeks * 7)),
      supplementaryWorkStartedAt,
    ),
  ];
}

/**
 * The pending deadline due soonest, for ordering a queue: a stage not done, with a due date not
 * yet passed at `now`. Missed stages are left out (they are overdue, not next). null if none.
 */
export function nextDeadline(deadlines: readonly Deadline[], now: Date): Deadline | null {
  const at = requireDate(now, "now").getTime();
  let next: Deadline | null = null;
  for (const d of deadlines) {
    if (d.state !== "pending" || d.doneAt !== null || d.dueAt === null || d.dueAt.getTime() < at) continue;
    if (next === null || d.dueAt.getTime() < next.dueAt!.getTime()) next = d;
  }
  return next;
}

function stateOf(dueAt: Date | null, doneAt: Date | null, now: Date): DeadlineState {
  if (doneAt) return dueAt === null || doneAt.getTime() <= dueAt.getTime() ? "met" : "missed";
  if (dueAt && now.getTime() > dueAt.getTime()) return "missed";
  return "pending";
}

function requirePolicy(policy: DeadlinePolicy): DeadlinePolicy {
  if (!policy || typeof policy !== "object") throw new RangeError("policy is required");
  const hours = policy.emergencyMakeSafeHours;
  if (typeof hours !== "number" || !Number.isFinite(hours) || hours < 0) {
    throw new RangeError(`policy.emergencyMakeSafeHours must be a finite number ≥ 0, got ${String(hours)}`);
  }
  for (const key of [
    "investigateWorkingDays",
    "summaryWorkingDays",
    "safetyWorkWorkingDays",
    "supplementaryWorkWeeks",
  ] as const) {
    const value = policy[key];
    if (!Number.isInteger(value) || value < 0) {
      throw new RangeError(`policy.${key} must be a whole number ≥ 0, got ${String(value)}`);
    }
  }
  return policy;
}

function requireDate(value: Date, name: string): Date {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) {
    throw new RangeError(`${name} must be a valid Date, got ${String(value)}`);
  }
  return value;
}

function optionalDate(value: Date | null | undefined, name: string): Date | null {
  return isAbsent(value) ? null : requireDate(value, name);
}
