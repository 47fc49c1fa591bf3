// Every allowed and every disallowed status move. The table is our own choice (see case-workflow.ts);
// this test pins it so a change to the workflow is a deliberate one.
import { describe, expect, it } from "vitest";
import {
  CASE_STATUSES,
  canTransition,
  movesValidForAll,
  stepsForward,
  transitionNeedsReason,
  type CaseStatus,
} from "../../src/lib/domain/case-workflow.js";

const allowed: [CaseStatus, CaseStatus][] = [
  ["new", "triaged"],
  ["new", "cancelled"],
  ["triaged", "inspection-booked"],
  ["triaged", "investigated"],
  ["triaged", "cancelled"],
  ["inspection-booked", "investigated"],
  ["inspection-booked", "triaged"],
  ["inspection-booked", "cancelled"],
  ["investigated", "works-planned"],
  ["investigated", "closed"],
  ["investigated", "cancelled"],
  ["works-planned", "works-done"],
  ["works-planned", "investigated"],
  ["works-planned", "cancelled"],
  ["works-done", "monitoring"],
  ["works-done", "closed"],
  ["monitoring", "closed"],
  ["monitoring", "investigated"],
  ["monitoring", "triaged"],
  ["closed", "triaged"],
  ["cancelled", "triaged"],
];
const key = (a: string, b: string) => `${a}→${b}`;
const allowedKeys = new Set(allowed.map(([a, b]) => key(a, b)));

describe("case status moves (our own workflow)", () => {
  for (const from of CASE_STATUSES) {
    for (const to of CASE_STATUSES) {
      const ok = allowedKeys.has(key(from, to));
      it(`${ok ? "allows" : "refuses"} ${from} → ${to}`, () => {
        expect(canTransition(from, to)).toBe(ok);
      });
    }
  }

  it("never allows staying in place, so every recorded move changes something", () => {
    for (const s of CASE_STATUSES) expect(canTransition(s, s)).toBe(false);
  });

  it("asks for a reason to cancel and to reopen, and not for the main path", () => {
    expect(transitionNeedsReason("new", "cancelled")).toBe(true);
    expect(transitionNeedsReason("closed", "triaged")).toBe(true);
    expect(transitionNeedsReason("cancelled", "triaged")).toBe(true);
    expect(transitionNeedsReason("monitoring", "triaged")).toBe(true);
    expect(transitionNeedsReason("new", "triaged")).toBe(false);
    expect(transitionNeedsReason("works-done", "monitoring")).toBe(false);
  });

  it("reaches closed from new along the main path", () => {
    const path: CaseStatus[] = [
      "new",
      "triaged",
      "inspection-booked",
      "investigated",
      "works-planned",
      "works-done",
      "monitoring",
      "closed",
    ];
    for (let i = 1; i < path.length; i++) expect(canTransition(path[i - 1]!, path[i]!)).toBe(true);
  });

  it("walks forward along the main path with the fewest allowed steps, and never backwards", () => {
    // Our own rule: the case follows its work (an inspection on a new case ends investigated).
    expect(stepsForward("new", "investigated")).toEqual(["triaged", "investigated"]);
    expect(stepsForward("inspection-booked", "investigated")).toEqual(["investigated"]);
    expect(stepsForward("new", "works-planned")).toEqual(["triaged", "investigated", "works-planned"]);
    expect(stepsForward("works-planned", "monitoring")).toEqual(["works-done", "monitoring"]);
    expect(stepsForward("monitoring", "closed")).toEqual(["closed"]);
    expect(stepsForward("investigated", "investigated")).toEqual([]);
    expect(stepsForward("works-done", "investigated")).toBeNull();
    expect(stepsForward("cancelled", "investigated")).toBeNull();
    expect(stepsForward("closed", "investigated")).toBeNull();
    for (const from of CASE_STATUSES) {
      for (const to of CASE_STATUSES) {
        const steps = stepsForward(from, to);
        if (!steps) continue;
        let at = from;
        for (const step of steps) {
          expect(canTransition(at, step)).toBe(true);
          at = step;
        }
        expect(at).toBe(to);
      }
    }
  });

  it("offers for several cases at once only the moves each of them can make", () => {
    expect(movesValidForAll(["new", "triaged"])).toEqual(["cancelled"]);
    expect(movesValidForAll(["triaged", "inspection-booked"])).toEqual(["investigated", "cancelled"]);
    expect(movesValidForAll(["closed", "cancelled"])).toEqual(["triaged"]);
    expect(movesValidForAll([])).toEqual([]);
  });
});
