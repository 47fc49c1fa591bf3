// Inspection, written summary and messages, and how they drive the deadline clocks.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let officer: Client;
let bedroomId: number;
const report = {
  description: "Black mould across the bedroom wall.",
  locations: ["external-wall"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  bedroomId = (await tenant.get("/api/me/home")).body.property.rooms.find((r: { kind: string }) => r.kind === "bedroom").id;
});
afterAll(() => t.close());

const inspection = (inspectedAt: string) => ({
  inspectedAt,
  cause: "condensation",
  mouldExtent: "1-to-5-m2",
  findings: "Mould on the external wall behind the bed; the wall surface is cold and the extractor fan does not run.",
  roomReadings: [
    {
      roomId: bedroomId,
      airTemperatureC: 16.5,
      relativeHumidityPct: 74,
      surfaceTemperaturesC: [10.2, 9.1],
      moisture: { value: 14, unit: "wme" },
    },
  ],
});

describe("the investigation", () => {
  it("records the inspection, moves the case to investigated and starts the summary and works clocks", async () => {
    const c = (
      await officer
        .post("/api/cases", { ...report, propertyId: landlord.home.id, channel: "phone", awareAt: "2025-12-19T10:00:00Z" })
        .expect(201)
    ).body;
    await officer
      .patch(`/api/cases/${c.id}`, {
        status: "triaged",
        hazardClass: "significant",
        reason: "Spreading mould, child in the home.",
      })
      .expect(200);
    // The investigation ended on Mon 5 January 2026, 11:00 UTC (GMT).
    await officer.post(`/api/cases/${c.id}/inspections`, inspection("2026-01-05T11:00:00Z")).expect(201);
    expect((await officer.get(`/api/cases/${c.id}`)).body.status).toBe("investigated");
    const { deadlines } = (await officer.get(`/api/cases/${c.id}/deadlines`).expect(200)).body;
    const byStage = Object.fromEntries(deadlines.map((d: { stage: string }) => [d.stage, d]));
    // Investigate: due end of Wed 7 Jan 2026 (10 working days after Fri 19 Dec 2025, see case-status.test.ts); done 5 Jan → met.
    expect(byStage.investigate).toMatchObject({
      dueAt: "2026-01-07T23:59:59.999Z",
      doneAt: "2026-01-05T11:00:00.000Z",
      state: "met",
    });
    // Summary: 3 working days after Mon 5 Jan → end of Thu 8 Jan 2026; never sent, so missed.
    expect(byStage.summary).toMatchObject({ dueAt: "2026-01-08T23:59:59.999Z", state: "missed" });
    // Safety work: 5 working days after Mon 5 Jan → end of Mon 12 Jan 2026.
    expect(byStage["safety-work"].dueAt).toBe("2026-01-12T23:59:59.999Z");
    // Supplementary work: 12 weeks (84 days) after 5 Jan → end of Mon 30 March 2026, in BST by then (23:59:59.999 BST = 22:59:59.999Z).
    expect(byStage["supplementary-work"].dueAt).toBe("2026-03-30T22:59:59.999Z");
  });

  it("sends the written summary to the tenant only after an inspection, and records when", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const body = {
      body: "We found condensation mould on the bedroom's external wall. This is a significant hazard. We will fit a continuous extractor fan and wash the mould within 5 working days.",
    };
    const early = await officer.post(`/api/cases/${c.id}/summary`, body).expect(409);
    expect(early.body.error.message).toMatch(/inspection/);
    await officer.post(`/api/cases/${c.id}/inspections`, inspection(hoursAgo(1).toISOString())).expect(201);
    await officer.post(`/api/cases/${c.id}/summary`, body).expect(201);
    const mail = await t.mail.lastTo(landlord.tenant.email);
    expect(mail.subject).toContain(c.reference);
    expect(mail.raw).toMatch(/continuous extractor fan/);
    const summary = (await officer.get(`/api/cases/${c.id}/deadlines`)).body.deadlines.find(
      (d: { stage: string }) => d.stage === "summary",
    );
    expect(summary.state).toBe("met");
    const events = (await tenant.get(`/api/cases/${c.id}/events`)).body.events.map((e: { type: string }) => e.type);
    expect(events).toEqual(expect.arrayContaining(["inspection-recorded", "summary-sent"]));
  });

  it("e-mails messages to the tenant and keeps internal notes from them", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    await officer
      .post(`/api/cases/${c.id}/messages`, { body: "A surveyor will call on Tuesday morning.", internal: false })
      .expect(201);
    expect((await t.mail.lastTo(landlord.tenant.email)).raw).toMatch(/Tuesday morning/);
    await officer.post(`/api/cases/${c.id}/messages`, { body: "Check the loft insulation too.", internal: true }).expect(201);
    const tenantTypes = (await tenant.get(`/api/cases/${c.id}/events`)).body.events.map((e: { type: string }) => e.type);
    expect(tenantTypes).toContain("message-to-tenant");
    expect(tenantTypes).not.toContain("internal-note");
    const staffTypes = (await officer.get(`/api/cases/${c.id}/events`)).body.events.map((e: { type: string }) => e.type);
    expect(staffTypes).toContain("internal-note");
  });

  it("validates inspections and keeps these routes to staff of the landlord", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const bad = await officer
      .post(`/api/cases/${c.id}/inspections`, { ...inspection("2026-01-05T11:00:00Z"), cause: "gremlins" })
      .expect(400);
    expect(bad.body.error.details[0].field).toBe("cause");
    await officer
      .post(`/api/cases/${c.id}/inspections`, { ...inspection("2026-01-05T11:00:00Z"), roomReadings: [{ roomId: 999999 }] })
      .expect(400);
    await tenant.post(`/api/cases/${c.id}/inspections`, inspection("2026-01-05T11:00:00Z")).expect(403);
    // Tenants write on their case too (tests/server/conversation.test.ts), but never an internal note.
    await tenant.post(`/api/cases/${c.id}/messages`, { body: "hi", internal: true }).expect(400);
    await tenant.get(`/api/cases/${c.id}/deadlines`).expect(403);
    const other = await makeLandlord(t.ctx.dataSource);
    const outsider = await signedInClient(t.app, other.officer.email, PASSWORD);
    await outsider.post(`/api/cases/${c.id}/inspections`, inspection("2026-01-05T11:00:00Z")).expect(404);
    await outsider.get(`/api/cases/${c.id}/deadlines`).expect(404);
  });
});

describe("the landlord's deadline policy", () => {
  it("uses the England default until an admin sets the landlord's own timeframes, which the clocks then follow", async () => {
    const fresh = await makeLandlord(t.ctx.dataSource);
    const admin = await signedInClient(t.app, fresh.admin.email, PASSWORD);
    const staff = await signedInClient(t.app, fresh.officer.email, PASSWORD);
    // TRADE.md §5: 24 hours, 10, 3 and 5 working days, 12 weeks; and our 21-day monitoring period.
    expect((await staff.get("/api/policy").expect(200)).body).toEqual({
      emergencyMakeSafeHours: 24,
      investigateWorkingDays: 10,
      summaryWorkingDays: 3,
      safetyWorkWorkingDays: 5,
      supplementaryWorkWeeks: 12,
      monitoringDays: 21,
      emergencyPhone: null,
      source: "default",
    });
    const c = (
      await staff
        .post("/api/cases", { ...report, propertyId: fresh.home.id, channel: "phone", awareAt: "2025-12-19T10:00:00Z" })
        .expect(201)
    ).body;
    const due = async () =>
      (await staff.get(`/api/cases/${c.id}/deadlines`)).body.deadlines.find((d: { stage: string }) => d.stage === "investigate")
        .dueAt;
    expect(await due()).toBe("2026-01-07T23:59:59.999Z");
    const own = {
      emergencyMakeSafeHours: 12,
      investigateWorkingDays: 5,
      summaryWorkingDays: 2,
      safetyWorkWorkingDays: 3,
      supplementaryWorkWeeks: 8,
    };
    await staff.agent.put("/api/policy").set("X-CSRF-Token", staff.csrf).send(own).expect(403);
    expect((await admin.agent.put("/api/policy").set("X-CSRF-Token", admin.csrf).send(own).expect(200)).body).toEqual({
      ...own,
      monitoringDays: 21,
      emergencyPhone: null,
      source: "landlord",
    });
    // 5 working days after Fri 19 Dec 2025, skipping 25 and 26 Dec (the holiday package's data): 22, 23, 24, 29, 30 Dec.
    expect(await due()).toBe("2025-12-30T23:59:59.999Z");
    // Another landlord still has the default.
    expect((await officer.get("/api/policy").expect(200)).body.source).toBe("default");
    const bad = await admin.agent
      .put("/api/policy")
      .set("X-CSRF-Token", admin.csrf)
      .send({ ...own, investigateWorkingDays: 0 })
      .expect(400);
    expect(bad.body.error.details[0].field).toBe("investigateWorkingDays");
    expect((await admin.agent.delete("/api/policy").set("X-CSRF-Token", admin.csrf).expect(200)).body.source).toBe("default");
    await tenant.get("/api/policy").expect(403);
  });
});
