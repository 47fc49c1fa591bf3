// The clocks of a formal complaint. Sources beside each check: TRADE.md §5 for the default timeframes
// (the complaint-handling timeframes, marked there [M, from memory]), the holiday package's data for
// the bank holidays (date-holidays 3.37.0: Christmas Day Friday 25 December 2026, Boxing Day Saturday
// 26 December with its substitute Monday 28 December, New Year's Day Friday 1 January 2027, Good
// Friday 26 March and Easter Monday 29 March 2027), the calendar for weekdays and clock changes (BST
// from Sunday 28 March 2027), and our own counting (working-days.ts: day 0 is the day of the event,
// due at 23:59:59.999 London time). Every expected date is counted by hand in the comments.
import { describe, expect, it } from "vitest";
import {
  COMPLAINT_HANDLING_DEFAULT_POLICY,
  complaintClocks,
  complaintStageClock,
} from "../../src/lib/domain/complaint-clocks.js";

const at = (iso: string) => new Date(iso);
const policy = COMPLAINT_HANDLING_DEFAULT_POLICY;
const iso = (d: Date | null) => d?.toISOString() ?? null;

describe("the default policy", () => {
  it("is the complaint-handling timeframes of TRADE.md §5 [M, from memory]", () => {
    expect(COMPLAINT_HANDLING_DEFAULT_POLICY).toEqual({
      stage1AcknowledgeWorkingDays: 5,
      stage1RespondWorkingDays: 10,
      stage2AcknowledgeWorkingDays: 5,
      stage2RespondWorkingDays: 20,
      extensionMaxWorkingDays: 10,
    });
  });
});

describe("stage 1 across Christmas and New Year", () => {
  // Raised Monday 21 December 2026, 10:00 GMT (day 0).
  const RAISED = at("2026-12-21T10:00:00Z");
  // Acknowledge within 5 working days: Tue 22 (1), Wed 23 (2), Thu 24 (3), Fri 25 Christmas Day (no),
  // Sat 26, Sun 27 (weekend), Mon 28 substitute for Boxing Day (no), Tue 29 (4), Wed 30 (5).
  const ACK_DUE = "2026-12-30T23:59:59.999Z";
  // Acknowledged Wednesday 30 December, 15:00 GMT (day 0 of the response clock).
  const ACKED = at("2026-12-30T15:00:00Z");
  // Respond within 10 working days of it: Thu 31 (1), Fri 1 Jan New Year's Day (no), Sat 2, Sun 3,
  // Mon 4 (2), Tue 5 (3), Wed 6 (4), Thu 7 (5), Fri 8 (6), Mon 11 (7), Tue 12 (8), Wed 13 (9), Thu 14 (10).
  const RESPOND_DUE = "2027-01-14T23:59:59.999Z";
  // Extended by 10 working days: Fri 15 (1), Mon 18 (2), Tue 19 (3), Wed 20 (4), Thu 21 (5), Fri 22 (6),
  // Mon 25 (7), Tue 26 (8), Wed 27 (9), Thu 28 January (10).
  const EXTENDED_DUE = "2027-01-28T23:59:59.999Z";

  it("acknowledge due skips Christmas Day and the Boxing Day substitute", () => {
    const clock = complaintStageClock(1, { startedAt: RAISED }, policy, RAISED);
    expect(iso(clock.acknowledgeDueAt)).toBe(ACK_DUE);
    expect(clock.acknowledge).toBe("pending");
  });

  it("respond due counts from the acknowledgement, skipping New Year's Day", () => {
    const clock = complaintStageClock(1, { startedAt: RAISED, acknowledgedAt: ACKED }, policy, ACKED);
    expect(clock.acknowledge).toBe("met");
    expect(iso(clock.respondDueAt)).toBe(RESPOND_DUE);
    expect(clock.respond).toBe("pending");
  });

  it("before the acknowledgement, respond due counts from the acknowledgement's due day (ours)", () => {
    // From Wed 30 December, the same count as above: Thu 14 January.
    const clock = complaintStageClock(1, { startedAt: RAISED }, policy, RAISED);
    expect(iso(clock.respondDueAt)).toBe(RESPOND_DUE);
  });

  it("an extension of 10 working days moves the response, not the acknowledgement", () => {
    const clock = complaintStageClock(
      1,
      { startedAt: RAISED, acknowledgedAt: ACKED, extensionWorkingDays: 10 },
      policy,
      at("2027-01-20T12:00:00Z"),
    );
    expect(iso(clock.acknowledgeDueAt)).toBe(ACK_DUE);
    expect(iso(clock.respondDueAt)).toBe(EXTENDED_DUE);
    // Without it, Wednesday 20 January would be past the due date.
    expect(clock.respond).toBe("pending");
    expect(complaintStageClock(1, { startedAt: RAISED, acknowledgedAt: ACKED }, policy, at("2027-01-20T12:00:00Z")).respond).toBe(
      "missed",
    );
  });

  it("met at the last millisecond of the due day, missed one minute after it", () => {
    const inTime = complaintStageClock(1, { startedAt: RAISED, acknowledgedAt: at(ACK_DUE) }, policy, at(ACK_DUE));
    expect(inTime.acknowledge).toBe("met");
    const late = at("2026-12-31T00:00:59.999Z");
    const missed = complaintStageClock(1, { startedAt: RAISED, acknowledgedAt: late }, policy, late);
    expect(missed.acknowledge).toBe("missed");
    // Late, so the response counts from the real acknowledgement, Thu 31 December (day 0):
    // Mon 4 (1), Tue 5 (2), Wed 6 (3), Thu 7 (4), Fri 8 (5), Mon 11 (6), Tue 12 (7), Wed 13 (8), Thu 14 (9), Fri 15 (10).
    expect(iso(missed.respondDueAt)).toBe("2027-01-15T23:59:59.999Z");
    // Not yet acknowledged and now past due: missed.
    expect(complaintStageClock(1, { startedAt: RAISED }, policy, late).acknowledge).toBe("missed");
  });
});

describe("stage 2 across Easter and the change to BST", () => {
  // Escalated Tuesday 23 March 2027, 09:00 GMT (day 0).
  const ESCALATED = at("2027-03-23T09:00:00Z");
  // Acknowledge within 5 working days: Wed 24 (1), Thu 25 (2), Fri 26 Good Friday (no), Sat 27, Sun 28
  // (weekend; BST from 01:00 UTC), Mon 29 Easter Monday (no), Tue 30 (3), Wed 31 (4), Thu 1 April (5),
  // ending 23:59:59.999 BST = 22:59:59.999 UTC.
  const ACK_DUE = "2027-04-01T22:59:59.999Z";
  // Acknowledged Thursday 25 March, 12:00 GMT (day 0).
  const ACKED = at("2027-03-25T12:00:00Z");
  // Respond within 20 working days of it: Fri 26 and Mon 29 are holidays; Tue 30 (1), Wed 31 (2),
  // Thu 1 (3), Fri 2 (4), Mon 5 (5), Tue 6 (6), Wed 7 (7), Thu 8 (8), Fri 9 (9), Mon 12 (10), Tue 13 (11),
  // Wed 14 (12), Thu 15 (13), Fri 16 (14), Mon 19 (15), Tue 20 (16), Wed 21 (17), Thu 22 (18),
  // Fri 23 (19), Mon 26 April (20), end of day BST.
  const RESPOND_DUE = "2027-04-26T22:59:59.999Z";

  it("runs from the escalation with the stage 2 timeframes", () => {
    const [one, two] = complaintClocks({
      raisedAt: at("2027-02-01T10:00:00Z"),
      stage1: { acknowledgedAt: at("2027-02-02T10:00:00Z"), respondedAt: at("2027-02-10T10:00:00Z") },
      stage2: { startedAt: ESCALATED, acknowledgedAt: ACKED },
      policy,
      now: at("2027-04-02T10:00:00Z"),
    });
    expect([one.acknowledge, one.respond]).toEqual(["met", "met"]);
    expect(iso(two.acknowledgeDueAt)).toBe(ACK_DUE);
    expect(two.acknowledge).toBe("met");
    expect(iso(two.respondDueAt)).toBe(RESPOND_DUE);
    expect(two.respond).toBe("pending");
  });

  it("is not started before an escalation", () => {
    const [, two] = complaintClocks({ raisedAt: ESCALATED, stage1: {}, stage2: null, policy, now: ESCALATED });
    expect(two).toMatchObject({ acknowledge: "not-started", respond: "not-started", acknowledgeDueAt: null, respondDueAt: null });
  });
});

describe("a landlord's own timeframes", () => {
  it("change the clocks", () => {
    // Raised Monday 21 December 2026; acknowledge within 2 working days: Tue 22 (1), Wed 23 (2).
    const own = { ...policy, stage1AcknowledgeWorkingDays: 2, stage1RespondWorkingDays: 3 };
    const clock = complaintStageClock(1, { startedAt: at("2026-12-21T10:00:00Z") }, own, at("2026-12-21T10:00:00Z"));
    expect(iso(clock.acknowledgeDueAt)).toBe("2026-12-23T23:59:59.999Z");
    // Respond within 3 of Wed 23: Thu 24 (1), [Fri 25, Sat, Sun, Mon 28 not], Tue 29 (2), Wed 30 (3).
    expect(iso(clock.respondDueAt)).toBe("2026-12-30T23:59:59.999Z");
  });

  it("refuses an extension that is not a whole number of days", () => {
    expect(() =>
      complaintStageClock(
        1,
        { startedAt: at("2026-12-21T10:00:00Z"), extensionWorkingDays: 0 },
        policy,
        at("2026-12-21T10:00:00Z"),
      ),
    ).toThrow(RangeError);
  });
});
