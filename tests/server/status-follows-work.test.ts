// Statuses follow the work: recording an inspection, sending the written summary, booking the
// works, completing them and the verdict on the fix move the case themselves (forward along the
// main path, each step its own status-changed event), with no status changed by hand. A status
// changed by hand is an exception and needs a reason; a bulk change can be previewed first.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { hoursAgo, testClock, workingDayAhead } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;
let tenant: Client;
const report = {
  description: "Mould on the bathroom ceiling above the bath.",
  locations: ["ceiling"],
  observations: ["mould-spots"],
};
const inspection = () => ({
  inspectedAt: hoursAgo(1).toISOString(),
  cause: "condensation",
  mouldExtent: "under-1-m2",
  findings: "Extract fan not working; condensation mould on the ceiling above the bath.",
  roomReadings: [],
});

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

const newCase = async (): Promise<{ id: number; reference: string }> =>
  (await tenant.post("/api/cases", report).expect(201)).body;
const status = async (id: number) => (await officer.get(`/api/cases/${id}`).expect(200)).body.status as string;
const moves = async (id: number) =>
  (
    (await officer.get(`/api/cases/${id}/events`).expect(200)).body.events as {
      type: string;
      before: { status: string } | null;
      after: { status: string; reason: string | null };
    }[]
  )
    .filter((e) => e.type === "status-changed")
    .map((e) => ({ move: `${e.before!.status}→${e.after.status}`, reason: e.after.reason }));

describe("the case follows its work", () => {
  it("an inspection recorded on a new case ends investigated, each step on the timeline", async () => {
    const c = await newCase();
    await officer.post(`/api/cases/${c.id}/inspections`, inspection()).expect(201);
    expect(await status(c.id)).toBe("investigated");
    expect(await moves(c.id)).toEqual([
      { move: "new→triaged", reason: "Inspection recorded." },
      { move: "triaged→investigated", reason: "Inspection recorded." },
    ]);
  });

  it("the written summary moves a case not yet investigated (here reopened after it got worse) to investigated", async () => {
    const c = await newCase();
    await officer.post(`/api/cases/${c.id}/inspections`, inspection()).expect(201);
    await officer.patch(`/api/cases/${c.id}`, { status: "closed", reason: "No works needed after the visit." }).expect(200);
    await tenant.post(`/api/cases/${c.id}/worse`, { note: "The mould is back on the ceiling." }).expect(200);
    expect(await status(c.id)).toBe("triaged");
    await officer.post(`/api/cases/${c.id}/summary`, { body: "We came back and found the fan had failed again." }).expect(201);
    expect(await status(c.id)).toBe("investigated");
    expect((await moves(c.id)).at(-1)).toEqual({ move: "triaged→investigated", reason: "Written summary sent to the tenant." });
  });

  it("sending the summary never moves a case backwards", async () => {
    const c = await newCase();
    await officer.post(`/api/cases/${c.id}/inspections`, inspection()).expect(201);
    const wo = (
      await officer.post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash the ceiling." }).expect(201)
    ).body;
    await lead
      .patch(`/api/work-orders/${wo.id}`, {
        assigneeId: landlord.maintenance.id,
        slot: { date: workingDayAhead(3), window: "am" },
      })
      .expect(200);
    expect(await status(c.id)).toBe("works-planned");
    await officer.post(`/api/cases/${c.id}/summary`, { body: "We will wash the ceiling and fit a new fan." }).expect(201);
    expect(await status(c.id)).toBe("works-planned");
  });

  it("booking the works moves an investigated case to works-planned", async () => {
    const c = await newCase();
    await officer.post(`/api/cases/${c.id}/inspections`, inspection()).expect(201);
    const wo = (
      await officer
        .post(`/api/cases/${c.id}/work-orders`, { type: "extractor-fan", description: "Replace the bathroom fan." })
        .expect(201)
    ).body;
    expect(await status(c.id)).toBe("investigated");
    await lead
      .patch(`/api/work-orders/${wo.id}`, {
        assigneeId: landlord.maintenance.id,
        slot: { date: workingDayAhead(4), window: "pm" },
      })
      .expect(200);
    expect(await status(c.id)).toBe("works-planned");
    expect((await moves(c.id)).at(-1)).toEqual({ move: "investigated→works-planned", reason: "The works are booked." });
  });

  it("completing the works moves the case to monitoring, and the verdict closes it", async () => {
    const c = await newCase();
    await officer.post(`/api/cases/${c.id}/inspections`, inspection()).expect(201);
    const wo = (
      await officer.post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash the ceiling." }).expect(201)
    ).body;
    await lead
      .patch(`/api/work-orders/${wo.id}`, {
        complete: { note: "Washed the ceiling with fungicide.", doneOn: localDate(testClock.now()) },
      })
      .expect(200);
    expect(await status(c.id)).toBe("monitoring");
    expect((await moves(c.id)).slice(-3).map((m) => m.move)).toEqual([
      "investigated→works-planned",
      "works-planned→works-done",
      "works-done→monitoring",
    ]);
    await lead
      .post(`/api/cases/${c.id}/verification`, {
        effective: true,
        note: "Dry ceiling, no new spots.",
        // Day 0 of monitoring: no readings after the works yet, so the verdict needs a recorded override.
        override: { reason: "Checked on site with the tenant: the ceiling is dry." },
      })
      .expect(200);
    expect(await status(c.id)).toBe("closed");
    // Six moves, not one of them made by hand.
    expect((await moves(c.id)).length).toBe(6);
  });
});

describe("moves by hand", () => {
  it("need a reason: 400 naming reason, and nothing changes", async () => {
    const c = await newCase();
    const res = await officer.patch(`/api/cases/${c.id}`, { status: "triaged" }).expect(400);
    expect(res.body.error.details[0].field).toBe("reason");
    expect(await status(c.id)).toBe("new");
    await officer.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "Spoke to the tenant by phone." }).expect(200);
    expect((await moves(c.id)).at(-1)).toEqual({ move: "new→triaged", reason: "Spoke to the tenant by phone." });
  });
});

describe("bulk status preview", () => {
  it("offers the moves valid for every chosen case and names the cases a move would skip", async () => {
    const a = await newCase();
    const b = await newCase();
    await officer.patch(`/api/cases/${b.id}`, { status: "triaged", reason: "Read the report." }).expect(200);
    const other = await makeLandlord(t.ctx.dataSource);
    const foreign = (await (await signedInClient(t.app, other.tenant.email, PASSWORD)).post("/api/cases", report).expect(201))
      .body;

    const preview = (await officer.post("/api/cases/bulk/preview", { ids: [a.id, b.id, foreign.id] }).expect(200)).body;
    expect(preview.common).toEqual(["cancelled"]);
    // Another landlord's case is left out, as if it did not exist.
    expect(preview.cases.map((c: { id: number }) => c.id)).toEqual([a.id, b.id]);
    expect(preview.cases[1]).toMatchObject({ status: "triaged", allowed: ["inspection-booked", "investigated", "cancelled"] });
    expect(preview.skipped).toEqual([]);

    const toTriaged = (await officer.post("/api/cases/bulk/preview", { ids: [a.id, b.id], status: "triaged" }).expect(200)).body;
    expect(toTriaged.skipped).toEqual([{ id: b.id, reference: b.reference, status: "triaged" }]);
    // A preview changes nothing.
    expect(await status(a.id)).toBe("new");

    await (
      await signedInClient(t.app, landlord.maintenance.email, PASSWORD)
    )
      .post("/api/cases/bulk/preview", { ids: [a.id] })
      .expect(403);
    await officer.post("/api/cases/bulk/preview", { ids: [] }).expect(400);
  });
});
