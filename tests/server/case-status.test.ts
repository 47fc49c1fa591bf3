// PATCH /api/cases/:id: status along the workflow (409 otherwise), assignee and hazard class, each on the timeline.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { canTransition, CASE_STATUSES } from "../../src/lib/domain/case-workflow.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let officer: Client;
const report = { description: "Mould on the bathroom ceiling.", locations: ["ceiling"], observations: ["mould-spots"] };
const newCase = async () => (await tenant.post("/api/cases", report).expect(201)).body as { id: number };

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
});
afterAll(() => t.close());

describe("status changes", () => {
  it("moves along the workflow, recording each move with before and after", async () => {
    const c = await newCase();
    for (const status of [
      "triaged",
      "inspection-booked",
      "investigated",
      "works-planned",
      "works-done",
      "monitoring",
      "closed",
    ]) {
      const res = await officer
        .patch(`/api/cases/${c.id}`, { status, reason: `Moved by hand to ${status} for this test.` })
        .expect(200);
      expect(res.body.status).toBe(status);
    }
    const events = (await tenant.get(`/api/cases/${c.id}/events`)).body.events.filter(
      (e: { type: string }) => e.type === "status-changed",
    );
    expect(
      events.map((e: { before: { status: string }; after: { status: string } }) => `${e.before.status}→${e.after.status}`),
    ).toEqual([
      "new→triaged",
      "triaged→inspection-booked",
      "inspection-booked→investigated",
      "investigated→works-planned",
      "works-planned→works-done",
      "works-done→monitoring",
      "monitoring→closed",
    ]);
    // Reopening needs a reason (as does every move made by hand).
    await officer.patch(`/api/cases/${c.id}`, { status: "triaged" }).expect(400);
    await officer.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "The tenant reports the mould is back." }).expect(200);
  });

  it("answers 409 for every move the workflow does not allow from new, and changes nothing", async () => {
    const c = await newCase();
    for (const to of CASE_STATUSES) {
      if (to === "new" || canTransition("new", to)) continue;
      const res = await officer.patch(`/api/cases/${c.id}`, { status: to, reason: "testing a refused move" }).expect(409);
      expect(res.body.error.message).toContain("cannot move to");
      expect(res.body.error.details.allowed).toEqual(["triaged", "cancelled"]);
    }
    expect((await t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: c.id })).status).toBe("new");
  });

  it("cancels only with a reason", async () => {
    const c = await newCase();
    const res = await officer.patch(`/api/cases/${c.id}`, { status: "cancelled" }).expect(400);
    expect(res.body.error.details[0].field).toBe("reason");
    await officer.patch(`/api/cases/${c.id}`, { status: "cancelled", reason: "Logged twice by mistake." }).expect(200);
  });
});

describe("assignee and hazard class", () => {
  it("assigns to staff of the same landlord only, and unassigns with null", async () => {
    const c = await newCase();
    const res = await officer.patch(`/api/cases/${c.id}`, { assigneeId: landlord.maintenance.id }).expect(200);
    expect(res.body.assigneeId).toBe(landlord.maintenance.id);
    await officer.patch(`/api/cases/${c.id}`, { assigneeId: landlord.tenant.id }).expect(400);
    const other = await makeLandlord(t.ctx.dataSource);
    await officer.patch(`/api/cases/${c.id}`, { assigneeId: other.officer.id }).expect(400);
    expect((await officer.patch(`/api/cases/${c.id}`, { assigneeId: null }).expect(200)).body.assigneeId).toBeNull();
  });

  it("classifies the hazard with a reason, recorded on the timeline", async () => {
    const c = await newCase();
    await officer.patch(`/api/cases/${c.id}`, { hazardClass: "significant" }).expect(400);
    const res = await officer
      .patch(`/api/cases/${c.id}`, { hazardClass: "significant", reason: "Spreading mould in a child's bedroom." })
      .expect(200);
    expect(res.body.hazardClass).toBe("significant");
    const events = (await officer.get(`/api/cases/${c.id}/events`)).body.events;
    expect(events.at(-1)).toMatchObject({ type: "hazard-classified", after: { hazardClass: "significant" } });
    await officer.patch(`/api/cases/${c.id}`, { hazardClass: "urgent", reason: "x x x" }).expect(400);
    await officer.patch(`/api/cases/${c.id}`, {}).expect(400);
    await officer.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "x x x", colour: "red" }).expect(400);
  });
});

describe("who may change a case", () => {
  it("refuses tenants and maintenance with 403 and other landlords with 404", async () => {
    const c = await newCase();
    await tenant.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "Not allowed." }).expect(403);
    const maintenance = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
    await maintenance.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "Not allowed." }).expect(403);
    const other = await makeLandlord(t.ctx.dataSource);
    const outsider = await signedInClient(t.app, other.officer.email, PASSWORD);
    await outsider.patch(`/api/cases/${c.id}`, { status: "triaged", reason: "Not allowed." }).expect(404);
    expect((await t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: c.id })).status).toBe("new");
  });
});

describe("deadlines", () => {
  it("gives a significant case logged by phone on Friday 19 December 2025 an investigation deadline across Christmas", async () => {
    // 10 working days after Fri 19 Dec 2025, skipping the weekends and the bank holidays of
    // Thu 25 Dec, Fri 26 Dec and Thu 1 Jan (the holiday package's data for 2025 and 2026):
    // 22, 23, 24, 29, 30, 31 Dec, 2, 5, 6, 7 Jan → end of Wed 7 January 2026 in London (GMT).
    // That is long past, and no investigation was recorded, so the stage shows as missed.
    const res = await officer
      .post("/api/cases", { ...report, propertyId: landlord.home.id, channel: "phone", awareAt: "2025-12-19T10:00:00Z" })
      .expect(201);
    await officer
      .patch(`/api/cases/${res.body.id}`, { hazardClass: "significant", reason: "Mould over a large area of the bedroom." })
      .expect(200);
    const { body } = await officer.get(`/api/cases/${res.body.id}/deadlines`).expect(200);
    expect(body.deadlines.map((d: { stage: string }) => d.stage)).toEqual([
      "make-safe",
      "investigate",
      "summary",
      "safety-work",
      "supplementary-work",
    ]);
    expect(body.deadlines[0].state).toBe("not-applicable");
    expect(body.deadlines[1]).toEqual({
      stage: "investigate",
      dueAt: "2026-01-07T23:59:59.999Z",
      doneAt: null,
      state: "missed",
      missedReason: null,
    });
    await tenant.get(`/api/cases/${res.body.id}/deadlines`).expect(403);
  });

  it("gives an emergency 24 hours to make safe", async () => {
    const c = await newCase();
    await officer
      .patch(`/api/cases/${c.id}`, { hazardClass: "emergency", reason: "Water through the ceiling light fitting." })
      .expect(200);
    const { body } = await officer.get(`/api/cases/${c.id}/deadlines`).expect(200);
    const awareAt = (await officer.get(`/api/cases/${c.id}`)).body.awareAt;
    expect(body.deadlines[0].dueAt).toBe(new Date(new Date(awareAt).getTime() + 24 * 3_600_000).toISOString());
    expect(body.deadlines[0].state).toBe("pending");
  });
});
