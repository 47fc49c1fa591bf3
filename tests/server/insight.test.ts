// The compliance dashboard (GET /api/insight/dashboard) and "what works" (GET /api/insight/what-works):
// each figure against a small set of cases whose answers are worked out by hand below.
//
// Counting rules checked here (server/modules/insight/insight.service.ts): a case is in the period when
// the landlord became aware of it on a London date in [from, to]; cancelled cases are left out; a stage
// is met when done by its due time, missed when done after it or not done and past it, open otherwise.
// Working days and deadlines as in src/lib/domain/working-days.ts and deadlines.ts (TRADE.md §5).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

const DAY = 86_400_000;
const HOUR = 3_600_000;
let t: TestApp;
let officer: Client;
let tenant: Client;
let otherOfficer: Client;
let range: string;
let S: Date; // 00:00 UTC of the last Sunday of October (the day the clocks go back, BST → GMT at 01:00 UTC)

/**
 * The most recent last Sunday of October at least 45 days before now, so that every deadline below
 * (the latest is ten working days after awareness, ≈ S + 12 days) has passed whatever day the tests run.
 */
function clockChangeSunday(now: Date): Date {
  for (let year = now.getUTCFullYear(); ; year -= 1) {
    const d = new Date(Date.UTC(year, 9, 31));
    d.setUTCDate(31 - d.getUTCDay()); // back to Sunday
    if (now.getTime() - d.getTime() >= 45 * DAY) return d;
  }
}
const at = (days: number, hours = 0, minutes = 0) => new Date(S.getTime() + days * DAY + hours * HOUR + minutes * 60_000);

const report = (propertyId: number, awareAt: Date) => ({
  propertyId,
  awareAt: awareAt.toISOString(),
  channel: "phone",
  description: "Black mould on the bedroom's outside wall, behind the wardrobe.",
  locations: ["external-wall"],
  observations: ["mould-spots"],
});
const inspection = (inspectedAt: Date) => ({
  inspectedAt: inspectedAt.toISOString(),
  cause: "condensation",
  mouldExtent: "1-to-5-m2",
  findings: "Mould on the external wall behind the wardrobe; the wall surface is cold.",
});

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  S = clockChangeSunday(testClock.now());
  const a = await makeLandlord(ds); // its own home is in "Test Estate": 1 home, no cases
  const b = await makeLandlord(ds); // another landlord: its cases must never be counted
  officer = await signedInClient(t.app, a.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, a.tenant.email, PASSWORD);
  otherOfficer = await signedInClient(t.app, b.officer.email, PASSWORD);

  const alder = [];
  for (let i = 0; i < 4; i++) alder.push(await makeProperty(ds, a.org, { estate: "Alder" }));
  const birch = [await makeProperty(ds, a.org, { estate: "Birch" }), await makeProperty(ds, a.org, { estate: "Birch" })];
  const log = async (client: Client, propertyId: number, awareAt: Date) =>
    (await client.post("/api/cases", report(propertyId, awareAt)).expect(201)).body.id as number;
  const summaryAt = (caseId: number, sentAt: Date) =>
    ds.query("INSERT INTO written_summaries (case_id, sender_user_id, body, sent_at) VALUES (?, ?, ?, ?)", [
      caseId,
      a.officer.id,
      "We found condensation on a cold wall and will fit an extractor fan.",
      sentAt,
    ]);
  const workDone = (org: number, caseId: number, type: string, completedAt: Date, by: number) =>
    ds.query(
      `INSERT INTO work_orders (organisation_id, case_id, type, description, room_ids, priority, target_date, status, completed_at, created_by_id)
       VALUES (?, ?, ?, 'Fit it.', '[]', 'routine', ?, 'done', ?, ?)`,
      [org, caseId, type, localDate(completedAt), completedAt, by],
    );

  // E, Alder home 1, emergency. Aware Saturday S−1 at 11:00 UTC (12:00 BST). The clocks go back at
  // 01:00 UTC on Sunday, so 24 elapsed hours end at S 11:00 UTC, which London shows as 11:00 GMT (not
  // 12:00). Investigated at S 11:01 UTC: investigate MISSED by one minute (a wall-clock reading of
  // "same time next day" would wrongly call it met). Make-safe: due at the same moment, never recorded:
  // MISSED. Summary sent Monday S+1 10:00: due 3 working days after Sunday (Mon, Tue, Wed) → MET.
  // Works begun Tuesday S+2 10:00: further work due 84 days after → MET. Safety work: not applicable.
  // Working days from awareness (Saturday, day 0): investigation Sunday → 0; summary Monday → 1; works Tuesday → 2.
  const E = await log(officer, alder[0]!.id, at(-1, 11));
  await officer
    .patch(`/api/cases/${E}`, { hazardClass: "emergency", reason: "Child with asthma; mould spreading fast." })
    .expect(200);
  await officer.post(`/api/cases/${E}/inspections`, inspection(at(0, 11, 1))).expect(201);
  await summaryAt(E, at(1, 10));
  await workDone(a.org.id, E, "extractor-fan", at(2, 10), a.maintenance.id);

  // C2, Alder home 1 again, aware S−1 13:00 (after E): a REPEAT. Significant (unclassified), nothing done.
  // Investigate due 10 working days after Saturday → Friday S+12, passed → MISSED. The later stages
  // run from an investigation that has not happened: OPEN (no due time).
  const C2 = await log(officer, alder[0]!.id, at(-1, 13));

  // C3, Alder home 2, aware Thursday S−10 09:00. Investigated Saturday S−8 (due ten working days after
  // Thursday, in November) → MET, 1 working day (Friday S−9). From Saturday S−8 (day 0) the working days
  // are Mon S−6, Tue S−5, Wed S−4, Thu S−3, Fri S−2. No summary: due after 3 → Wednesday S−4, passed →
  // MISSED. Works begun Saturday S+6: safety work due after 5 → Friday S−2 → MISSED; further work
  // (84 days) → MET. Working days Thursday S−10 → Saturday S+6: Fri S−9 (1), Mon S−6 … Fri S−2 (5),
  // Mon S+1 … Fri S+5 (5) → 11.
  const C3 = await log(officer, alder[1]!.id, at(-10, 9));
  await officer.post(`/api/cases/${C3}/inspections`, inspection(at(-8, 10))).expect(201);
  await workDone(a.org.id, C3, "insulation", at(6, 10), a.maintenance.id);

  // C4, Birch home 1, not significant, aware Tuesday S−5, investigated Wednesday S−4: investigate MET
  // (no statutory due time), 1 working day; no other stage applies.
  const C4 = await log(officer, birch[0]!.id, at(-5, 9));
  await officer.patch(`/api/cases/${C4}`, { hazardClass: "not-significant", reason: "A small patch by the window." }).expect(200);
  await officer.post(`/api/cases/${C4}/inspections`, inspection(at(-4, 9))).expect(201);

  // C5, Birch home 2, cancelled: left out of every figure of the period.
  const C5 = await log(officer, birch[1]!.id, at(-3, 9));
  await officer.patch(`/api/cases/${C5}`, { status: "cancelled", reason: "Logged twice by mistake." }).expect(200);

  // Before the period (S−40), Alder home 3: open, so it counts among the open cases only.
  await log(officer, alder[2]!.id, at(-40, 9));

  // Another landlord's case in the same period: never counted.
  await log(otherOfficer, b.home.id, at(-2, 9));

  // The fixtures above wrote summaries and work orders behind the services' backs: work the clocks out again.
  for (const id of [E, C2, C3, C4, C5]) await t.ctx.services.triage.refresh(id);
  range = `from=${localDate(at(-20))}&to=${localDate(S)}`;

  // "What works", on landlord B (so its cases stay out of A's dashboard): closed cases with a verdict.
  // Group 1: extractor fan alone, B's mid-terrace solid-brick single-glazed homes: 5 verdicts, 1 effective
  // → 20 %; changes in hours a day at ≥ 80 %: +1.0, −2.0, +0.5, none, −4.0 → sorted −4, −2, 0.5, 1 →
  // median (−2 + 0.5) / 2 = −0.75.
  // Group 2: insulation + mould wash, same homes: 4 verdicts → under five: never sent.
  const verdict = async (type: string[], effective: boolean, change: number | null) => {
    const id = await log(otherOfficer, b.home.id, at(-30, 9));
    for (const ty of type) await workDone(b.org.id, id, ty, at(-20, 10), b.maintenance.id);
    await ds.query(
      "INSERT INTO case_events (case_id, actor_user_id, type, `before`, `after`, created_at) VALUES (?, ?, 'fix-verified', NULL, ?, ?)",
      [id, b.maintenance.id, JSON.stringify({ effective, note: "Checked.", hoursAt80PerDayChange: change }), at(-5, 10)],
    );
    await ds.query("UPDATE cases SET status = 'closed' WHERE id = ?", [id]);
  };
  await verdict(["extractor-fan"], true, 1.0);
  await verdict(["extractor-fan"], false, -2.0);
  await verdict(["extractor-fan"], false, 0.5);
  await verdict(["extractor-fan"], false, null);
  await verdict(["extractor-fan"], false, -4.0);
  for (let i = 0; i < 4; i++) await verdict(["insulation", "mould-wash"], true, -6);
}, 120_000);

afterAll(async () => {
  await t?.close();
});

describe("the compliance dashboard", () => {
  it("counts each deadline stage met, missed and open, with the minute missed across the clock change", async () => {
    const d = (await officer.get(`/api/insight/dashboard?${range}`).expect(200)).body;
    const stage = (s: string) => d.stages.find((r: { stage: string }) => r.stage === s);
    // make-safe: E missed.
    expect(stage("make-safe")).toMatchObject({ met: 0, missed: 1, open: 0, metPct: 0, missedPct: 100 });
    // investigate: E missed (by one minute), C2 missed, C3 met, C4 met → 2 of 4 each = 50 %.
    expect(stage("investigate")).toMatchObject({ met: 2, missed: 2, open: 0, metPct: 50, missedPct: 50 });
    // summary: E met, C3 missed, C2 open → 1/3 = 33.3 %.
    expect(stage("summary")).toMatchObject({ met: 1, missed: 1, open: 1, metPct: 33.3, missedPct: 33.3 });
    // safety work: C3 missed, C2 open (E emergency and C4 not significant: not applicable).
    expect(stage("safety-work")).toMatchObject({ met: 0, missed: 1, open: 1, metPct: 0, missedPct: 50 });
    // further work: E met, C3 met, C2 open → 2/3 = 66.7 %.
    expect(stage("supplementary-work")).toMatchObject({ met: 2, missed: 0, open: 1, metPct: 66.7 });
    // By month: every case of the period was reported in October (S−10 … S−1 all fall in October).
    const october = localDate(S).slice(0, 7);
    expect(
      d.stagesByMonth.find((r: { month: string; stage: string }) => r.month === october && r.stage === "investigate"),
    ).toMatchObject({
      met: 2,
      missed: 2,
    });
  });

  it("gives the median and 90th percentile of working days from awareness", async () => {
    const d = (await officer.get(`/api/insight/dashboard?${range}`).expect(200)).body;
    const to = (k: string) => d.durations.find((r: { to: string }) => r.to === k);
    // investigation: E 0, C3 1, C4 1 → median 1; 90th: ⌈0.9 × 3⌉ = 3rd smallest → 1.
    expect(to("investigation")).toEqual({ to: "investigation", cases: 3, medianWorkingDays: 1, p90WorkingDays: 1 });
    // summary: E 1 only.
    expect(to("summary")).toEqual({ to: "summary", cases: 1, medianWorkingDays: 1, p90WorkingDays: 1 });
    // works begun: E 2, C3 11 → median (2 + 11) / 2 = 6.5; 90th: ⌈1.8⌉ = 2nd → 11.
    expect(to("works-begun")).toEqual({ to: "works-begun", cases: 2, medianWorkingDays: 6.5, p90WorkingDays: 11 });
    expect(to("works-completed")).toEqual({ to: "works-completed", cases: 0, medianWorkingDays: null, p90WorkingDays: null });
  });

  it("counts repeats, hotspots per 100 homes, the season and the open cases", async () => {
    const d = (await officer.get(`/api/insight/dashboard?${range}`).expect(200)).body;
    // E, C2, C3, C4 in the period; C2's home had E 2 hours before → 1 of 4 = 25 %.
    expect(d.repeats).toEqual({ cases: 4, repeats: 1, pct: 25 });
    // Alder: 4 homes, 3 cases (E, C2, C3) → 75.0; Birch: 2 homes, 1 case (C4; C5 cancelled) → 50.0;
    // Test Estate: 1 home, 0 cases → 0. Sorted highest first: Alder is the top one.
    const estates = d.hotspots.filter((h: { dimension: string }) => h.dimension === "estate");
    expect(estates).toEqual([
      { dimension: "estate", value: "Alder", homes: 4, cases: 3, perHundredHomes: 75 },
      { dimension: "estate", value: "Birch", homes: 2, cases: 1, perHundredHomes: 50 },
      { dimension: "estate", value: "Test Estate", homes: 1, cases: 0, perHundredHomes: 0 },
    ]);
    // Every home is a mid-terrace: 7 homes, 4 cases → 57.1.
    expect(d.hotspots.find((h: { dimension: string }) => h.dimension === "builtForm")).toMatchObject({
      value: "mid-terrace",
      homes: 7,
      cases: 4,
      perHundredHomes: 57.1,
    });
    expect(d.seasonal.find((m: { month: string }) => m.month === localDate(S).slice(0, 7))).toEqual({
      month: localDate(S).slice(0, 7),
      cases: 4,
    });
    // Open now, whatever the period: E, C3, C4 investigated; C2 and the older case new; no readings, no assessment.
    expect(d.open.total).toBe(5);
    expect(d.open.byStatus).toEqual([
      { key: "investigated", count: 3 },
      { key: "new", count: 2 },
    ]);
    expect(d.open.byRisk).toEqual([{ key: "unknown", count: 5 }]);
    expect(d.open.byCategory).toEqual([{ key: "none", count: 5 }]);
    expect(d.estates).toEqual(["Alder", "Birch", "Test Estate"]);
  });

  it("filters by estate and by period from the query, and refuses a bad one", async () => {
    const birch = (await officer.get(`/api/insight/dashboard?${range}&estate=Birch`).expect(200)).body;
    // Only C4: investigate met.
    expect(birch.stages.find((r: { stage: string }) => r.stage === "investigate")).toMatchObject({ met: 1, missed: 0, open: 0 });
    expect(birch.repeats).toEqual({ cases: 1, repeats: 0, pct: 100 * 0 });
    expect(birch.estate).toBe("Birch");
    // A period of the last day only (S): no case was reported on Sunday S.
    const sunday = (await officer.get(`/api/insight/dashboard?from=${localDate(S)}&to=${localDate(S)}`).expect(200)).body;
    expect(sunday.repeats.cases).toBe(0);
    const bad = await officer.get("/api/insight/dashboard?from=2026-02-30").expect(400);
    expect(bad.body.error.details[0].field).toBe("from");
    await officer.get(`/api/insight/dashboard?from=${localDate(S)}&to=${localDate(at(-1))}`).expect(400);
  });

  it("is for staff only, and counts only the landlord's own cases", async () => {
    await tenant.get(`/api/insight/dashboard?${range}`).expect(403);
    await tenant.get(`/api/insight/what-works?${range}`).expect(403);
    await tenant.get(`/api/insight/export?table=stages&${range}`).expect(403);
    const other = (await otherOfficer.get(`/api/insight/dashboard?${range}`).expect(200)).body;
    // B has one case of its own in the period (the what-works cases were reported on S−30, before it).
    expect(other.repeats.cases).toBe(1);
    expect(other.estates).toEqual(["Test Estate"]);
  });

  it("exports a table as CSV and .xlsx with the screen's headings", async () => {
    const csv = await officer.get(`/api/insight/export?table=stages&${range}`).expect(200);
    expect(csv.headers["content-type"]).toContain("text/csv");
    const lines = csv.text
      .replace(/^\uFEFF/, "")
      .trim()
      .split("\r\n");
    expect(lines[0]).toBe("Stage,Met,Missed,Open,Met %,Missed %");
    expect(lines).toContain("Investigate,2,2,0,50,50");
    const xlsx = await officer.get(`/api/insight/export?table=hotspots&format=xlsx&${range}`).buffer(true).expect(200);
    expect(xlsx.headers["content-type"]).toContain("spreadsheetml");
    await officer.get(`/api/insight/export?table=nonsense`).expect(400);
  });
});

describe("what works", () => {
  it("shows groups of five or more verdicts with the share effective and the median change, never a group of four", async () => {
    const w = (await otherOfficer.get(`/api/insight/what-works?from=${localDate(at(-60))}&to=${localDate(S)}`).expect(200)).body;
    expect(w.groups).toEqual([
      {
        workTypes: ["extractor-fan"],
        builtForm: "mid-terrace",
        wallType: "solid-brick",
        glazingType: "single",
        cases: 5,
        effective: 1,
        effectivePct: 20,
        medianHoursAt80PerDayChange: -0.75,
      },
    ]);
    // The insulation + mould wash group (4) is not sent, only that a group was left out.
    expect(w.groupsNotShown).toBe(1);
    expect(JSON.stringify(w)).not.toContain("mould-wash");
    const csv = await otherOfficer
      .get(`/api/insight/export?table=what-works&from=${localDate(at(-60))}&to=${localDate(S)}`)
      .expect(200);
    expect(csv.text).not.toContain("Mould wash");
    // Landlord A has no verdicts.
    expect((await officer.get(`/api/insight/what-works?${range}`).expect(200)).body.groups).toEqual([]);
  });
});
