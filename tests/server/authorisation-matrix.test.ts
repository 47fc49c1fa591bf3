// Authorisation across the whole API: every route of ENDPOINTS is called as each kind of person —
// nobody signed in, the home's tenant, a tenant of another home of the same landlord, the landlord's
// officer, maintenance lead and admin, and another landlord's admin and officer — with the ids of
// real records of the first landlord filled in. Each answer is held against the table in
// authorisation-matrix.expectations.ts. A route without a row, or a row without a route, fails.
// Bodies are empty ({}), so an allowed write mostly stops at validation (400) and changes nothing,
// except where validation comes before the ownership check: those routes get a small valid body
// (BODIES), so a person who may not touch the record is refused for that and not for the body. Their
// writes add to the case, never end it. The few routes that act on an empty body run last (LAST).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ENDPOINTS, type Endpoint } from "../../src/lib/contracts/endpoints.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, workingDaysAhead } from "../support/test-clock.js";
import { ACTORS, MATRIX, type Actor, type Expected } from "./authorisation-matrix.expectations.js";

/** Routes that change something even with an empty body: called after every other route. */
const LAST = [
  "POST /api/auth/invitations/:userId/resend",
  "POST /api/auth/invitations/:userId/cancel",
  "DELETE /api/properties/:id/rooms/:roomId",
  "DELETE /api/webhooks/:id",
  "POST /api/tenancy-imports/:id/invitations/cancel",
  "POST /api/auth/logout",
];

/** Small valid bodies, so the answer is about who asks, not about the body. */
const BODIES: Record<string, (actor: Actor) => object> = {
  "POST /api/cases/bulk": () => ({ ids: [ids["/api/cases/:id"]], assigneeId: ids.officerId }),
  "POST /api/cases/bulk/preview": () => ({ ids: [ids["/api/cases/:id"]] }),
  "PUT /api/me/language": () => ({ language: "en" }),
  "PATCH /api/cases/:id": () => ({ assigneeId: ids.officerId }),
  "POST /api/cases/:id/worse": () => ({ note: "The patch has spread to the wall." }),
  "POST /api/cases/:id/assessments": () => ({
    likelihood: 180,
    spread: [0, 0.2, 10, 89.8],
    justification: "Mould over a bed in a cold room.",
  }),
  "POST /api/cases/:id/inspections": () => ({
    inspectedAt: hoursAgo(1).toISOString(),
    cause: "condensation",
    mouldExtent: "under-1-m2",
    findings: "Still damp above the window.",
  }),
  "POST /api/cases/:id/summary": () => ({ body: "We found condensation mould above the window and will wash it." }),
  "POST /api/cases/:id/messages": (actor) =>
    actor.endsWith("enant") ? { body: "Is there any news?" } : { body: "We will call this week.", internal: true },
  "POST /api/cases/:id/work-orders": () => ({ type: "other", description: "Check the window seals." }),
  "POST /api/cases/:id/verification": () => ({ effective: true, note: "Readings look dry." }),
  "PATCH /api/work-orders/:id": () => ({ assigneeId: ids.maintenanceId, slot: { date: ids.slotDate, window: "am" } }),
  "POST /api/work-orders/:id/booking-response": () => ({ response: "confirm" }),
  "PATCH /api/properties/:id": () => ({ town: "Testford" }),
  "POST /api/properties/:id/rooms": () => ({ name: "Landing", kind: "other" }),
  "PATCH /api/properties/:id/rooms/:roomId": () => ({ name: "Box room" }),
  "PUT /api/cases/:id/deadlines/:stage/missed-reason": () => ({ reason: "The inspector was taken ill that week." }),
  "PATCH /api/users/:id": () => ({ name: "Test maintenance" }),
  "PATCH /api/webhooks/:id": () => ({ description: "Housing system" }),
  // Complaints check the case before the body, but their bodies are parsed first: each names a stale
  // version or an open complaint already there, so an allowed caller gets 409 and nothing changes.
  "POST /api/cases/:id/complaints": () => ({ description: "Nobody has come to look at the mould." }),
  "POST /api/complaints/:id/acknowledge": () => ({ version: 99 }),
  "POST /api/complaints/:id/extend": () => ({ version: 99, workingDays: 2, reason: "Waiting for the roofer." }),
  "POST /api/complaints/:id/respond": () => ({ version: 99, response: "We are sorry for the wait." }),
  "POST /api/complaints/:id/escalate": () => ({ version: 99, reason: "Still unhappy." }),
  "POST /api/complaints/:id/close": () => ({ version: 99 }),
  "PUT /api/complaints/:id/remedy": () => ({ version: 99, apology: false }),
  "POST /api/sensor-alerts/:id/dismiss": () => ({ reason: "The sensor was next to a drying rack." }),
};

let t: TestApp;
const clients = {} as Record<Actor, Client>;
const ids: Record<string, string | number> = {};

const key = (e: Endpoint) => `${e.method} ${e.path}`;

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  const landlord = await makeLandlord(ds);
  const elsewhere = await makeLandlord(ds);
  const otherHome = await makeProperty(ds, landlord.org);
  const otherTenant = await makeTenant(ds, landlord.org, otherHome);

  const signIn = (email: string) => signedInClient(t.app, email, PASSWORD);
  clients.anonymous = await anonymousClient(t.app);
  clients.tenant = await signIn(landlord.tenant.email);
  clients.otherTenant = await signIn(otherTenant.email);
  clients.officer = await signIn(landlord.officer.email);
  clients.maintenance = await signIn(landlord.maintenance.email);
  clients.admin = await signIn(landlord.admin.email);
  clients.otherAdmin = await signIn(elsewhere.admin.email);
  clients.otherOfficer = await signIn(elsewhere.officer.email);
  const { tenant, officer, admin } = clients;

  // A case of the tenant's home with a photo, a logger import (one bad row) and a work order.
  const home = (await tenant.get("/api/me/home").expect(200)).body.property;
  const roomId: number = home.rooms[0].id;
  const created = await tenant
    .post("/api/cases", {
      description: "Mould on the bedroom ceiling above the window.",
      locations: ["ceiling"],
      observations: ["mould-spots"],
      roomIds: [roomId],
    })
    .expect(201);
  const caseId: number = created.body.id;
  const photo = await tenant.agent
    .post(`/api/cases/${caseId}/photos`)
    .set("X-CSRF-Token", tenant.csrf)
    .attach("photos", await jpegWithGps(640, 480, 1), "ceiling.jpg")
    .expect(201);
  const stamp = (h: number) => hoursAgo(h).toISOString().slice(0, 16).replace("T", " ");
  const csv = Buffer.from(`Time,Temperature,RH\n${stamp(30)}Z,19.5,72\n${stamp(29)}Z,abc,70\n${stamp(28)}Z,20.1,69\n`);
  const imported = await tenant.agent
    .post(`/api/cases/${caseId}/readings/import`)
    .set("X-CSRF-Token", tenant.csrf)
    .field("roomId", String(roomId))
    .attach("file", csv, "logger.csv")
    .expect(201);
  await officer
    .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: "Mould over a bed." })
    .expect(200);
  await officer
    .post(`/api/cases/${caseId}/inspections`, {
      inspectedAt: hoursAgo(2).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Condensation mould above the window.",
      roomReadings: [{ roomId, airTemperatureC: 18, relativeHumidityPct: 70 }],
    })
    .expect(201);
  const complaint = await tenant
    .post(`/api/cases/${caseId}/complaints`, { description: "Nobody came for three weeks." })
    .expect(201);
  const order = await officer
    .post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the ceiling with fungicide." })
    .expect(201);
  // A room only the delete route uses, and a pending invitation with its link's token.
  const spare = await admin.post(`/api/properties/${landlord.home.id}/rooms`, { name: "Box room", kind: "bedroom" }).expect(201);
  const invitee = `invitee.${caseId}@test.example`;
  await admin.post("/api/auth/invitations", { email: invitee, name: "Ina Vitee", role: "officer" }).expect(201);
  const apiKey = await admin.post("/api/integrations/api-keys", { name: "Matrix key", scopes: ["homes:read"] }).expect(201);
  const token = /\/invitation\/([A-Za-z0-9_-]{43})/.exec((await t.mail.lastTo(invitee)).raw)?.[1];
  if (!token) throw new Error("no invitation link in the e-mail");
  // A webhook endpoint (nothing listens at its address: deliveries to it just fail) with one delivery.
  const hook = await admin
    .post("/api/webhooks", { url: "http://127.0.0.1:9/dewline-events", eventTypes: ["case.created"] })
    .expect(201);
  const hookDelivery = await admin.post(`/api/webhooks/${hook.body.endpoint.id}/test`).expect(202);
  const sensor = await admin
    .post("/api/sensors", {
      propertyId: landlord.home.id,
      roomId,
      serial: `M-${caseId}`,
      model: "Matrix T/RH",
      placement: "external wall corner",
      measuresSurface: false,
      intervalS: 900,
      installedOn: "2025-01-01",
    })
    .expect(201);

  // A tenancy import that queued one invitation (its batch is paused, resumed and cancelled last).
  const uprn = String(100_000_000_000 + caseId);
  await makeProperty(ds, landlord.org, { uprn });
  const tenancyFile = Buffer.from(
    `Tenancy ref,UPRN,Name,Email,Start date\nT-${caseId},${uprn},Ten Ant,ten.${caseId}@test.example,2025-01-01\n`,
  );
  const tenancyImport = await admin.agent
    .post("/api/tenancy-imports")
    .set("X-CSRF-Token", admin.csrf)
    .attach("file", tenancyFile, "tenancies.csv")
    .expect(201);

  // A stock import of one home, for the routes that read an import.
  const register = Buffer.from(
    "UPRN,Address 1,Town,Postcode,Built form,Walls,Glazing,Heating\n990000000321,1 Test Row,Testford,ZX1 1AA,Flat,Cavity filled,Double glazed 2010,Gas combi boiler\n",
  );
  const stockImport = await admin.agent
    .post("/api/stock-imports")
    .set("X-CSRF-Token", admin.csrf)
    .attach("file", register, "register.csv")
    .expect(201);

  // A sensor alert on the tenant's home (which has an open case, so opening another is refused with 409).
  const [sensorAlert] = (await t.ctx.dataSource.query(
    `INSERT INTO sensor_alerts (organisation_id, property_id, room_id, sensor_id, rule, raised_at, figures, state, created_at)
     VALUES (?, ?, ?, 1, 'hours-at-80', '2026-11-05 00:00:00', '{"hoursAt80":72,"hoursCondensing":0,"condensingDays":0,"mouldIndex":0.2,"basis":"measured"}', 'open', NOW(3))
     RETURNING id`,
    [landlord.org.id, landlord.home.id, spare.body.id],
  )) as { id: number }[];

  Object.assign(ids, {
    "/api/sensor-alerts/:id": sensorAlert!.id,
    "/api/cases/:id": caseId,
    "/api/sensor-health/:id": sensor.body.sensor.id,
    "/api/stock-imports/:id": stockImport.body.id,
    "/api/properties/:id": landlord.home.id,
    "/api/work-orders/:id": order.body.id,
    "/api/complaints/:id": complaint.body.id,
    "/api/photos/:id": photo.body.photos[0].id,
    "/api/outbox/:id": (
      (await t.ctx.dataSource.query(
        "SELECT id FROM outbox_emails WHERE related_type = 'case' AND related_id = ? ORDER BY id LIMIT 1",
        [caseId],
      )) as { id: number }[]
    )[0]!.id,
    "/api/users/:id": landlord.maintenance.id,
    "/api/tenancy-imports/:id": tenancyImport.body.id,
    ":importId": imported.body.importId,
    ":roomId": spare.body.id,
    ":stage": "investigate",
    // The invitation's reply names no user (it must read the same for an address another landlord holds).
    ":userId": ((await t.ctx.dataSource.query("SELECT id FROM users WHERE email = ?", [invitee])) as { id: number }[])[0]!.id,
    ":token": token,
    ":keyId": apiKey.body.id,
    "/api/webhooks/:id": hook.body.endpoint.id,
    "/api/sensors/:id": sensor.body.sensor.id,
    ":deliveryId": hookDelivery.body.id,
    officerId: landlord.officer.id,
    maintenanceId: landlord.maintenance.id,
    slotDate: workingDaysAhead(12)[0]!,
  });
});
afterAll(() => t.close());

/** The route's path with ids of the landlord's real records. */
function concrete(e: Endpoint): string {
  return e.path
    .replace(/^\/api\/[a-z-]+\/:id/, (m) => m.replace(":id", String(ids[m])))
    .replace(/:[A-Za-z]+/g, (p) => String(ids[p]));
}

function call(actor: Actor, e: Endpoint, url: string) {
  const { agent, csrf } = clients[actor];
  const method = e.method.toLowerCase() as "get" | "post" | "put" | "patch" | "delete";
  if (method === "get") return agent.get(url);
  return agent[method](url)
    .set("X-CSRF-Token", csrf)
    .send(BODIES[key(e)]?.(actor) ?? {});
}

const passes = (status: number, expected: Expected) =>
  expected === "ok" ? status < 500 && ![401, 403, 404].includes(status) : status === expected;

describe("the authorisation matrix", () => {
  it("has one row for every route of ENDPOINTS and no row for a route that does not exist", () => {
    const routes = ENDPOINTS.map(key);
    expect(
      routes.filter((r) => !(r in MATRIX)),
      "routes without a row",
    ).toEqual([]);
    expect(
      Object.keys(MATRIX).filter((r) => !routes.includes(r)),
      "rows without a route",
    ).toEqual([]);
    for (const route of [...LAST, ...Object.keys(BODIES)]) expect(routes).toContain(route);
  });

  it("answers each person on each route as the table says", { timeout: 120_000 }, async () => {
    const ordered = [
      ...ENDPOINTS.filter((e) => !LAST.includes(key(e))),
      ...LAST.map((k) => ENDPOINTS.find((e) => key(e) === k)!),
    ];
    const wrong: string[] = [];
    for (const e of ordered) {
      const row = MATRIX[key(e)];
      if (!row) continue;
      const url = concrete(e);
      for (const actor of ACTORS) {
        const res = await call(actor, e, url);
        if (!passes(res.status, row[actor])) wrong.push(`${key(e)} as ${actor}: expected ${row[actor]}, got ${res.status}`);
      }
    }
    expect(wrong).toEqual([]);
  });
});
