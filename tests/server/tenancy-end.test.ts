// A tenancy's end date closes the tenant's access to that home's cases: on the end date itself they
// still see them; from the next London day they do not, and their home page says there is no current
// tenancy. Time is moved with the app's own clock, never by waiting.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

const DAY_MS = 86_400_000;
let offsetMs = 0;
const movedClock = { now: () => new Date(testClock.now().getTime() + offsetMs) };

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let caseId: number;

const report = (client: Client, roomId: number) =>
  client
    .post("/api/cases", {
      description: "Black mould behind the wardrobe.",
      locations: ["ceiling"],
      observations: ["mould-spots"],
      roomIds: [roomId],
    })
    .expect(201);

beforeAll(async () => {
  t = await createTestApp({}, undefined, movedClock);
  landlord = await makeLandlord(t.ctx.dataSource);
  // The tenancy ends tomorrow (London date).
  await t.ctx.dataSource
    .getRepository(Tenancy)
    .update({ tenantUserId: landlord.tenant.id }, { endDate: localDate(new Date(movedClock.now().getTime() + DAY_MS)) });
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const home = (await tenant.get("/api/me/home").expect(200)).body.property;
  caseId = (await report(tenant, home.rooms[0].id)).body.id;
});
afterAll(() => t.close());

describe("a tenancy's end date", () => {
  it("keeps the home's cases open to the tenant up to and including the end date", async () => {
    offsetMs = DAY_MS;
    await tenant.get(`/api/cases/${caseId}`).expect(200);
    const mine = await tenant.get("/api/me/cases").expect(200);
    expect(JSON.stringify(mine.body)).toContain(`"id":${caseId}`);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    await officer.post(`/api/cases/${caseId}/messages`, { body: "We will call on Tuesday.", internal: false }).expect(201);
    const unread = (await tenant.get("/api/me/unread-messages").expect(200)).body;
    expect(unread.items.map((i: { caseId: number }) => i.caseId)).toContain(caseId);
  });

  it("closes them from the day after: the case, its timeline, the list and the home are gone", async () => {
    offsetMs = 2 * DAY_MS;
    await tenant.get(`/api/cases/${caseId}`).expect(404);
    await tenant.get(`/api/cases/${caseId}/events`).expect(404);
    const mine = await tenant.get("/api/me/cases").expect(200);
    expect(JSON.stringify(mine.body)).not.toContain(`"id":${caseId}`);
    const home = await tenant.get("/api/me/home").expect(404);
    expect(home.body.error.message).toMatch(/current tenancy/);
    // Nor does the unread count still point at the old home's messages.
    const unread = (await tenant.get("/api/me/unread-messages").expect(200)).body;
    expect(unread).toMatchObject({ items: [], total: 0 });
    // Staff still see the case.
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    await officer.get(`/api/cases/${caseId}`).expect(200);
  });

  it("lets a tenant who moved to another of the landlord's homes see only the new home's cases", async () => {
    offsetMs = 0;
    const mover = await makeTenant(t.ctx.dataSource, landlord.org, landlord.home);
    const client = await signedInClient(t.app, mover.email, PASSWORD);
    const oldHome = (await client.get("/api/me/home").expect(200)).body.property;
    const oldCase = (await report(client, oldHome.rooms[0].id)).body.id;
    const newHome = await makeProperty(t.ctx.dataSource, landlord.org);
    const repo = t.ctx.dataSource.getRepository(Tenancy);
    await repo.update({ tenantUserId: mover.id, propertyId: landlord.home.id }, { endDate: localDate(movedClock.now()) });
    await repo.insert({
      tenantUserId: mover.id,
      propertyId: newHome.id,
      startDate: localDate(new Date(movedClock.now().getTime() + DAY_MS)),
      endDate: null,
    });
    offsetMs = 2 * DAY_MS;
    expect((await client.get("/api/me/home").expect(200)).body.property.id).toBe(newHome.id);
    await client.get(`/api/cases/${oldCase}`).expect(404);
    const newRooms = (await client.get("/api/me/home").expect(200)).body.property.rooms;
    const newCase = (await report(client, newRooms[0].id)).body.id;
    await client.get(`/api/cases/${newCase}`).expect(200);
  });
});
