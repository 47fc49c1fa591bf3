// Reporting a case: the smallest valid report, access rules, the immutable event log and e-mails.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CaseEvent } from "../../server/modules/cases/case-event.entity.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { makeLandlord, makeTenant, makeProperty, PASSWORD } from "../support/factories.js";
import { mailSettled, outboxCount } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
const smallest = {
  description: "Water runs down the bedroom window every morning.",
  locations: ["window"],
  observations: ["condensation"],
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  other = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

describe("a tenant reports", () => {
  it("accepts the smallest valid report for their own home with a reference and status new", async () => {
    const res = await tenant.post("/api/cases", smallest).expect(201);
    expect(res.body).toMatchObject({
      status: "new",
      channel: "tenant-online",
      property: { id: landlord.home.id },
      locations: ["window"],
      observations: ["condensation"],
      vulnerability: null,
    });
    // Aware now (by the app's clock), and the reference carries that year.
    const awareAt = new Date(res.body.awareAt);
    expect(Math.abs(awareAt.getTime() - testClock.now().getTime())).toBeLessThan(60_000);
    expect(res.body.reference).toMatch(new RegExp(`^DW-${awareAt.getUTCFullYear()}-\\d{5}$`));
    const events = await tenant.get(`/api/cases/${res.body.id}/events`).expect(200);
    expect(events.body.events[0]).toMatchObject({ type: "case-created", actor: { name: landlord.tenant.name, role: "tenant" } });
    expect(events.body.events[0].after).toMatchObject({ status: "new", reference: res.body.reference });
  });

  it("e-mails the tenant an acknowledgement with the reference, recorded in the outbox and on the timeline", async () => {
    const res = await tenant.post("/api/cases", smallest).expect(201);
    const mail = await t.mail.lastTo(landlord.tenant.email);
    expect(mail.subject).toContain(res.body.reference);
    expect(mail.raw).toMatch(/whatever any readings show/);
    const outbox = await t.ctx.dataSource
      .getRepository(OutboxEmail)
      .findOneByOrFail({ relatedType: "case", relatedId: res.body.id, template: "caseAcknowledgement" });
    expect(outbox.status).toBe("sent");
    const events = (await tenant.get(`/api/cases/${res.body.id}/events`)).body.events;
    expect(events.map((e: { type: string }) => e.type)).toContain("email-queued");
  });

  it("tells the organisation's officers at once when the household is vulnerable, and only once", async () => {
    await mailSettled(t);
    const before = t.mail.mails.filter((m) => m.to.includes(landlord.officer.email)).length;
    const res = await tenant
      .post("/api/cases", { ...smallest, vulnerability: ["children-under-15", "breathing-or-immune"] })
      .expect(201);
    const alert = await t.mail.lastTo(landlord.officer.email);
    expect(alert.subject).toContain(res.body.reference);
    expect(alert.raw).toMatch(/children under 15/);
    await tenant.post(`/api/cases/${res.body.id}/worse`, { note: "Spreading behind the cot." }).expect(200);
    // Once: the outbox (written in the request's transaction) holds one alert to this officer about this case;
    // "it's got worse" is an e-mail of its own (tests/server/escalation.test.ts).
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "caseAlert", caseId: res.body.id })).toBe(
      1,
    );
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "caseWorse", caseId: res.body.id })).toBe(
      1,
    );
    await mailSettled(t);
    expect(t.mail.mails.filter((m) => m.to.includes(landlord.officer.email)).length).toBe(before + 2);
    const row = await t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: res.body.id });
    expect(row.vulnerableHousehold).toBe(true);
    // An empty list means "none of these", which is different from skipping the question.
    const none = await tenant.post("/api/cases", { ...smallest, vulnerability: [] }).expect(201);
    expect(none.body.vulnerability).toEqual([]);
  });

  it("records rooms of the home and refuses rooms of another home", async () => {
    const home = await tenant.get("/api/me/home").expect(200);
    const bedroom = home.body.property.rooms.find((r: { kind: string }) => r.kind === "bedroom");
    const res = await tenant.post("/api/cases", { ...smallest, roomIds: [bedroom.id], since: "weeks", area: "a4" }).expect(201);
    expect(res.body.rooms).toEqual([{ id: bedroom.id, name: bedroom.name, kind: "bedroom" }]);
    const otherHome = await signedInClient(t.app, other.officer.email, PASSWORD);
    const foreignRoom = (await otherHome.get(`/api/properties/${other.home.id}`)).body.rooms[0].id;
    const count = await t.ctx.dataSource.getRepository(Case).count();
    const bad = await tenant.post("/api/cases", { ...smallest, roomIds: [foreignRoom] }).expect(400);
    expect(bad.body.error.details[0].field).toBe("roomIds");
    expect(await t.ctx.dataSource.getRepository(Case).count()).toBe(count);
  });

  it("refuses a report for someone else's home with 404", async () => {
    await tenant.post("/api/cases", { ...smallest, propertyId: other.home.id }).expect(404);
  });

  const bad: [string, object, string][] = [
    ["no description", { locations: ["window"], observations: ["condensation"] }, "description"],
    ["no locations", { description: "Mould", observations: ["mould-spots"] }, "locations"],
    ["an empty locations list", { ...smallest, locations: [] }, "locations"],
    ["an unknown location", { ...smallest, locations: ["garage"] }, "locations.0"],
    ["an unknown observation", { ...smallest, observations: ["ghosts"] }, "observations.0"],
    ["an unknown area", { ...smallest, area: "huge" }, "area"],
    ["an unknown vulnerability", { ...smallest, vulnerability: ["tall"] }, "vulnerability.0"],
  ];
  for (const [name, body, field] of bad) {
    it(`refuses ${name} with 400 naming ${field}`, async () => {
      const res = await tenant.post("/api/cases", body).expect(400);
      expect(res.body.error.details[0].field).toBe(field);
    });
  }
});

describe("who sees a case", () => {
  it("lets the tenant and their landlord's staff see it; another tenant and another landlord get 404", async () => {
    const created = (await tenant.post("/api/cases", smallest).expect(201)).body;
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    await officer.get(`/api/cases/${created.id}`).expect(200);
    const neighbour = await makeTenant(t.ctx.dataSource, landlord.org, await makeProperty(t.ctx.dataSource, landlord.org));
    const neighbourClient = await signedInClient(t.app, neighbour.email, PASSWORD);
    await neighbourClient.get(`/api/cases/${created.id}`).expect(404);
    await neighbourClient.get(`/api/cases/${created.id}/events`).expect(404);
    await neighbourClient.post(`/api/cases/${created.id}/worse`, { note: "not mine" }).expect(404);
    const outsider = await signedInClient(t.app, other.officer.email, PASSWORD);
    await outsider.get(`/api/cases/${created.id}`).expect(404);
    const mine = await tenant.get("/api/me/cases").expect(200);
    expect(mine.body.items.map((c: { id: number }) => c.id)).toContain(created.id);
    expect((await neighbourClient.get("/api/me/cases").expect(200)).body.items).toEqual([]);
  });

  it("lets staff log a phone report with the date the landlord became aware", async () => {
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const awareAt = "2026-11-20T09:30:00.000Z";
    const res = await officer
      .post("/api/cases", { ...smallest, propertyId: landlord.home.id, channel: "phone", awareAt })
      .expect(201);
    expect(res.body).toMatchObject({ channel: "phone", awareAt, reference: expect.stringMatching(/^DW-2026-/) });
    const mine = await tenant.get("/api/me/cases").expect(200);
    expect(mine.body.items.map((c: { id: number }) => c.id)).toContain(res.body.id);
    await officer.post("/api/cases", { ...smallest, propertyId: landlord.home.id, channel: "pigeon", awareAt }).expect(400);
    await officer.post("/api/cases", { ...smallest, propertyId: other.home.id, channel: "phone", awareAt }).expect(404);
    const maintenance = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
    await maintenance.post("/api/cases", { ...smallest, propertyId: landlord.home.id, channel: "phone", awareAt }).expect(403);
  });
});

describe("the event log", () => {
  it("cannot be changed or deleted, even directly in the database", async () => {
    const created = (await tenant.post("/api/cases", smallest).expect(201)).body;
    const repo = t.ctx.dataSource.getRepository(CaseEvent);
    const event = await repo.findOneByOrFail({ caseId: created.id, type: "case-created" });
    await expect(repo.update(event.id, { type: "tampered" })).rejects.toThrow(/append-only/);
    await expect(repo.delete(event.id)).rejects.toThrow(/append-only/);
    expect((await repo.findOneByOrFail({ id: event.id })).type).toBe("case-created");
  });
});
