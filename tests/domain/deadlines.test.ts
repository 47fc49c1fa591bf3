// Deadlines for a case. Sources beside each check: TRADE.md §5 (the England social-housing
// timeframes), the holiday package's data (bank holidays), the calendar (weekdays, clock changes),
// and our own choices (see deadlines.ts and working-days.ts: day 0 is the day of the event, a
// working-day stage ends at 23:59:59.999 Europe/London, 24 hours are elapsed hours, unclassified
// counts as significant). Every due instant is an exact UTC instant.
import { describe, expect, it } from "vitest";
import {
  DEADLINE_STAGES,
  ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY,
  computeDeadlines,
  nextDeadline,
  type Deadline,
  type DeadlineFacts,
  type DeadlineStage,
} from "../../src/lib/domain/deadlines.js";

const at = (iso: string) => new Date(iso);
const policy = ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY;

function run(facts: Partial<DeadlineFacts> & Pick<DeadlineFacts, "awareAt">) {
  const deadlines = computeDeadlines({ hazardClass: "significant", now: facts.awareAt, policy, ...facts });
  const get = (stage: DeadlineStage) => deadlines.find((d) => d.stage === stage)!;
  const due = (stage: DeadlineStage) => get(stage).dueAt?.toISOString() ?? null;
  const state = (stage: DeadlineStage) => get(stage).state;
  return { deadlines, get, due, state };
}

// Significant hazard, aware Friday 27 March 2026 10:00 GMT (BST from Sunday 29 March; Good Friday
// 3 April and Easter Monday 6 April from the holiday package's data).
const AWARE = at("2026-03-27T10:00:00Z");
const INVESTIGATE_DUE = "2026-04-14T22:59:59.999Z"; // 10 working days (TRADE.md §5), end of day BST
const ENDED = at("2026-04-14T20:00:00Z"); // Tuesday 14 April, 21:00 BST
const SUMMARY_DUE = "2026-04-17T22:59:59.999Z"; // 3 working days: Wed 15, Thu 16, Fri 17 (TRADE.md §5)
const SAFETY_DUE = "2026-04-21T22:59:59.999Z"; // 5 working days: … Mon 20, Tue 21 (TRADE.md §5)
const SUPPLEMENTARY_DUE = "2026-07-07T22:59:59.999Z"; // 12 weeks = 84 days after 14 April (TRADE.md §5; the calendar)

describe("the default policy", () => {
  it("is the England social-housing default (TRADE.md §5)", () => {
    expect(ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY).toEqual({
      emergencyMakeSafeHours: 24,
      investigateWorkingDays: 10,
      summaryWorkingDays: 3,
      safetyWorkWorkingDays: 5,
      supplementaryWorkWeeks: 12,
    });
    expect(Object.isFrozen(ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY)).toBe(true); // our own choice
  });
});

describe("computeDeadlines: shape", () => {
  it("always returns the five stages in order (our own choice)", () => {
    for (const hazardClass of ["emergency", "significant", "not-significant", null] as const) {
      const { deadlines } = run({ awareAt: AWARE, hazardClass });
      expect(deadlines.map((d) => d.stage)).toEqual([...DEADLINE_STAGES]);
      expect(DEADLINE_STAGES).toEqual(["make-safe", "investigate", "summary", "safety-work", "supplementary-work"]);
    }
  });
});

describe("a significant hazard (TRADE.md §5)", () => {
  it("on awareness: investigate due in 10 working days; the later stages wait for the investigation (our own choice: null, pending)", () => {
    const r = run({ awareAt: AWARE });
    expect(r.get("make-safe")).toEqual({ stage: "make-safe", dueAt: null, doneAt: null, state: "not-applicable" });
    expect(r.due("investigate")).toBe(INVESTIGATE_DUE);
    expect(r.state("investigate")).toBe("pending");
    for (const stage of ["summary", "safety-work", "supplementary-work"] as const) {
      expect(r.get(stage)).toEqual({ stage, dueAt: null, doneAt: null, state: "pending" });
    }
  });

  it("investigate: pending up to the due instant, missed after it (our own choice: strictly after)", () => {
    expect(run({ awareAt: AWARE, now: at(INVESTIGATE_DUE) }).state("investigate")).toBe("pending");
    expect(run({ awareAt: AWARE, now: at("2026-04-15T00:00:00Z") }).state("investigate")).toBe("missed");
  });

  it("investigate: met when done on the last day or exactly at due, missed when done late", () => {
    const later = at("2026-05-01T12:00:00Z");
    expect(run({ awareAt: AWARE, now: later, investigationEndedAt: ENDED }).state("investigate")).toBe("met");
    expect(run({ awareAt: AWARE, now: later, investigationEndedAt: at(INVESTIGATE_DUE) }).state("investigate")).toBe("met");
    const late = run({ awareAt: AWARE, now: later, investigationEndedAt: at("2026-04-15T08:00:00Z") });
    expect(late.state("investigate")).toBe("missed");
    expect(late.get("investigate").doneAt?.toISOString()).toBe("2026-04-15T08:00:00.000Z");
  });

  it("summary, safety work and supplementary work run from the end of the investigation", () => {
    const r = run({ awareAt: AWARE, now: ENDED, investigationEndedAt: ENDED });
    expect(r.due("summary")).toBe(SUMMARY_DUE);
    expect(r.due("safety-work")).toBe(SAFETY_DUE);
    expect(r.due("supplementary-work")).toBe(SUPPLEMENTARY_DUE);
    for (const stage of ["summary", "safety-work", "supplementary-work"] as const) expect(r.state(stage)).toBe("pending");
  });

  it("summary: pending → met, pending → missed, missed by a late summary", () => {
    const base = { awareAt: AWARE, investigationEndedAt: ENDED };
    expect(run({ ...base, now: at("2026-04-16T09:00:00Z") }).state("summary")).toBe("pending");
    expect(run({ ...base, now: at("2026-04-20T09:00:00Z"), summarySentAt: at("2026-04-17T16:00:00Z") }).state("summary")).toBe(
      "met",
    );
    expect(run({ ...base, now: at("2026-04-17T23:00:00Z") }).state("summary")).toBe("missed"); // 00:00 BST Saturday
    expect(run({ ...base, now: at("2026-04-20T09:00:00Z"), summarySentAt: at("2026-04-20T08:00:00Z") }).state("summary")).toBe(
      "missed",
    );
  });

  it("safety work: pending → met, pending → missed, missed by a late start", () => {
    const base = { awareAt: AWARE, investigationEndedAt: ENDED };
    expect(run({ ...base, now: at("2026-04-21T12:00:00Z") }).state("safety-work")).toBe("pending");
    expect(
      run({ ...base, now: at("2026-04-23T12:00:00Z"), safetyWorkStartedAt: at("2026-04-21T22:30:00Z") }).state("safety-work"),
    ).toBe("met"); // 23:30 BST
    expect(run({ ...base, now: at("2026-04-21T23:00:00Z") }).state("safety-work")).toBe("missed");
    expect(
      run({ ...base, now: at("2026-04-23T12:00:00Z"), safetyWorkStartedAt: at("2026-04-22T07:00:00Z") }).state("safety-work"),
    ).toBe("missed");
  });

  it("supplementary work: pending → met, pending → missed, missed by a late start (TRADE.md §5: 12 weeks)", () => {
    const base = { awareAt: AWARE, investigationEndedAt: ENDED };
    expect(run({ ...base, now: at("2026-07-07T12:00:00Z") }).state("supplementary-work")).toBe("pending");
    expect(
      run({ ...base, now: at("2026-07-10T12:00:00Z"), supplementaryWorkStartedAt: at("2026-07-07T08:00:00Z") }).state(
        "supplementary-work",
      ),
    ).toBe("met");
    expect(run({ ...base, now: at("2026-07-08T12:00:00Z") }).state("supplementary-work")).toBe("missed");
    expect(
      run({ ...base, now: at("2026-07-10T12:00:00Z"), supplementaryWorkStartedAt: at("2026-07-08T08:00:00Z") }).state(
        "supplementary-work",
      ),
    ).toBe("missed");
  });

  it("the clocks going back: aware Friday 23 October 2026 (the calendar)", () => {
    // 10 working days (TRADE.md §5): Mon 26 … Fri 30 October, Mon 2 … Fri 6 November, end of day GMT.
    expect(run({ awareAt: at("2026-10-23T15:00:00Z") }).due("investigate")).toBe("2026-11-06T23:59:59.999Z");
  });

  it("aware on a Saturday: counting starts on Monday (our own choice)", () => {
    expect(run({ awareAt: at("2026-11-07T14:00:00Z") }).due("investigate")).toBe("2026-11-20T23:59:59.999Z");
  });

  it("over Christmas 2026 (the holiday package's data: 25, 28 December and 1 January off)", () => {
    // Aware Monday 14 December: 15 … 18, 21 … 24 (8), 29, 30 (10).
    const r = run({ awareAt: at("2026-12-14T11:00:00Z"), investigationEndedAt: at("2026-12-24T10:00:00Z") });
    expect(r.due("investigate")).toBe("2026-12-30T23:59:59.999Z");
    expect(r.due("summary")).toBe("2026-12-31T23:59:59.999Z"); // 29, 30, 31
    expect(r.due("safety-work")).toBe("2027-01-05T23:59:59.999Z"); // 29, 30, 31, 4, 5
  });
});

describe("an unclassified case (null)", () => {
  it("is treated as significant until classified (our own choice)", () => {
    const facts = { awareAt: AWARE, now: at("2026-04-20T09:00:00Z"), investigationEndedAt: ENDED };
    expect(run({ ...facts, hazardClass: null }).deadlines).toEqual(run({ ...facts, hazardClass: "significant" }).deadlines);
  });
});

describe("an emergency hazard", () => {
  // Saturday 28 March 2026 12:00 GMT; the clocks go forward at 01:00 GMT on Sunday 29 (the calendar).
  const aware = at("2026-03-28T12:00:00Z");
  const due = "2026-03-29T12:00:00.000Z"; // 24 elapsed hours (TRADE.md §5; our own choice: elapsed), 13:00 BST

  it("make safe and investigate within 24 hours, weekend or not (TRADE.md §5)", () => {
    const r = run({ awareAt: aware, hazardClass: "emergency" });
    expect(r.due("make-safe")).toBe(due);
    expect(r.due("investigate")).toBe(due);
    expect(r.state("make-safe")).toBe("pending");
  });

  it("make-safe: met at or before 24 hours, missed after, missed by late completion", () => {
    const base = { awareAt: aware, hazardClass: "emergency" as const };
    expect(run({ ...base, now: at(due) }).state("make-safe")).toBe("pending");
    expect(run({ ...base, now: at("2026-03-29T12:00:00.001Z") }).state("make-safe")).toBe("missed");
    expect(run({ ...base, now: at("2026-03-30T09:00:00Z"), madeSafeAt: at(due) }).state("make-safe")).toBe("met");
    expect(run({ ...base, now: at("2026-03-30T09:00:00Z"), madeSafeAt: at("2026-03-29T14:00:00Z") }).state("make-safe")).toBe(
      "missed",
    );
  });

  it("summary and supplementary work apply, safety work is the make-safe stage (our own choice)", () => {
    const r = run({
      awareAt: aware,
      hazardClass: "emergency",
      now: at("2026-03-29T09:00:00Z"),
      investigationEndedAt: at("2026-03-28T18:00:00Z"),
    });
    expect(r.state("investigate")).toBe("met");
    expect(r.due("summary")).toBe("2026-04-01T22:59:59.999Z"); // 3 working days: Mon 30, Tue 31, Wed 1 (TRADE.md §5)
    expect(r.get("safety-work")).toMatchObject({ dueAt: null, state: "not-applicable" });
    expect(r.due("supplementary-work")).toBe("2026-06-20T22:59:59.999Z"); // 84 days after Saturday 28 March
  });

  it("24 hours across the clocks going back are elapsed hours too (our own choice)", () => {
    // Saturday 24 October 2026 12:00 UTC (13:00 BST) → Sunday 25 October 12:00 UTC (12:00 GMT).
    expect(run({ awareAt: at("2026-10-24T12:00:00Z"), hazardClass: "emergency" }).due("make-safe")).toBe(
      "2026-10-25T12:00:00.000Z",
    );
  });
});

describe("a hazard classified not significant (our own choice)", () => {
  it("every stage is not-applicable except investigate, pending until recorded and never missed", () => {
    const open = run({ awareAt: AWARE, hazardClass: "not-significant", now: at("2027-01-01T00:00:00Z") });
    expect(open.get("investigate")).toEqual({ stage: "investigate", dueAt: null, doneAt: null, state: "pending" });
    for (const stage of ["make-safe", "summary", "safety-work", "supplementary-work"] as const) {
      expect(open.get(stage)).toEqual({ stage, dueAt: null, doneAt: null, state: "not-applicable" });
    }
    expect(nextDeadline(open.deadlines, at("2027-01-01T00:00:00Z"))).toBeNull();
  });

  it("investigate is met once recorded; other recorded times are kept as doneAt", () => {
    const r = run({
      awareAt: AWARE,
      hazardClass: "not-significant",
      investigationEndedAt: ENDED,
      summarySentAt: at("2026-04-15T10:00:00Z"),
    });
    expect(r.state("investigate")).toBe("met");
    expect(r.get("summary")).toMatchObject({ state: "not-applicable", dueAt: null });
    expect(r.get("summary").doneAt?.toISOString()).toBe("2026-04-15T10:00:00.000Z");
  });
});

describe("a custom policy (TRADE.md §5: deadlines are per-landlord policy)", () => {
  const custom = {
    emergencyMakeSafeHours: 12,
    investigateWorkingDays: 5,
    summaryWorkingDays: 1,
    safetyWorkWorkingDays: 2,
    supplementaryWorkWeeks: 4,
  };

  it("uses its values for every stage", () => {
    // Aware Monday 21 December 2026: 22, 23, 24, then 29, 30 (the holiday package's data: 25 and 28 off).
    const r = run({ awareAt: at("2026-12-21T09:00:00Z"), policy: custom, investigationEndedAt: at("2026-12-30T15:00:00Z") });
    expect(r.due("investigate")).toBe("2026-12-30T23:59:59.999Z");
    expect(r.due("summary")).toBe("2026-12-31T23:59:59.999Z");
    expect(r.due("safety-work")).toBe("2027-01-04T23:59:59.999Z"); // 31, then Mon 4 (1 January off, the package's data)
    expect(r.due("supplementary-work")).toBe("2027-01-27T23:59:59.999Z"); // 28 days (the calendar)
    const e = run({ awareAt: at("2026-12-21T09:00:00Z"), policy: custom, hazardClass: "emergency" });
    expect(e.due("make-safe")).toBe("2026-12-21T21:00:00.000Z");
  });

  it("rejects a negative or fractional timeframe, a missing policy and invalid dates (our own choice)", () => {
    const facts = { awareAt: AWARE, now: AWARE, hazardClass: "significant" as const };
    expect(() => computeDeadlines({ ...facts, policy: { ...custom, investigateWorkingDays: -1 } })).toThrow(RangeError);
    expect(() => computeDeadlines({ ...facts, policy: { ...custom, supplementaryWorkWeeks: 1.5 } })).toThrow(RangeError);
    expect(() => computeDeadlines({ ...facts, policy: { ...custom, emergencyMakeSafeHours: Number.NaN } })).toThrow(RangeError);
    expect(() => computeDeadlines({ ...facts, policy: undefined as never })).toThrow(RangeError);
    expect(() => computeDeadlines({ ...facts, policy, awareAt: new Date("nope") })).toThrow(RangeError);
    expect(() => computeDeadlines({ ...facts, policy, investigationEndedAt: new Date("nope") })).toThrow(RangeError);
  });
});

describe("nextDeadline (our own choice: the pending stage due soonest; ties in stage order)", () => {
  const next = (facts: Partial<DeadlineFacts>, now: Date, list?: Deadline[]) =>
    nextDeadline(list ?? run({ awareAt: AWARE, now, ...facts }).deadlines, now);

  it("follows the case through its stages", () => {
    expect(next({}, AWARE)?.stage).toBe("investigate");
    expect(next({ investigationEndedAt: ENDED }, ENDED)?.stage).toBe("summary");
    expect(
      next(
        { investigationEndedAt: ENDED, summarySentAt: at("2026-04-16T09:00:00Z") },
        at("2026-04-16T10:00:00Z"),
      )?.dueAt?.toISOString(),
    ).toBe(SAFETY_DUE);
  });

  it("skips a missed stage, and returns null when nothing is pending", () => {
    expect(next({ investigationEndedAt: ENDED }, at("2026-04-18T09:00:00Z"))?.stage).toBe("safety-work");
    const allDone = {
      investigationEndedAt: ENDED,
      summarySentAt: at("2026-04-15T09:00:00Z"),
      safetyWorkStartedAt: at("2026-04-16T09:00:00Z"),
      supplementaryWorkStartedAt: at("2026-05-01T09:00:00Z"),
    };
    expect(next(allDone, at("2026-05-02T09:00:00Z"))).toBeNull();
  });

  it("an emergency's make-safe and investigate share a due time: make-safe comes first", () => {
    const r = run({ awareAt: AWARE, hazardClass: "emergency" });
    expect(nextDeadline(r.deadlines, AWARE)?.stage).toBe("make-safe");
  });

  it("re-checks a stale list against now", () => {
    const computedEarlier = run({ awareAt: AWARE, now: AWARE }).deadlines;
    expect(nextDeadline(computedEarlier, at("2026-04-15T00:00:00Z"))).toBeNull();
  });
});
