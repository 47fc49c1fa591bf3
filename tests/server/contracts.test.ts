// The API contract (src/lib/contracts) against the real server: one request per main endpoint, each
// reply checked with the schema ENDPOINTS names for that route. A field the server sends but the
// contract leaves out fails too (the parsed value would lose it), so neither side can drift.
import type { Test } from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { endpointFor, isJsonSchema } from "../../src/lib/contracts/index.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { testClock } from "../support/test-clock.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;
let admin: Client;
let tenant: Client;
let caseId: number;
let roomId: number;
let workOrderId: number;
const checked = new Set<string>();

/** Sends the request, expects the route's success status and a body that is exactly a contract value. */
async function conforms(method: string, url: string, send: Test) {
  const path = url.split("?")[0]!;
  const endpoint = endpointFor(method, path);
  expect(endpoint, `${method} ${path} is in ENDPOINTS`).toBeDefined();
  const res = await send;
  expect(res.status, `${method} ${url}: ${JSON.stringify(res.body)}`).toBe(endpoint!.status);
  if (!isJsonSchema(endpoint!.response)) throw new Error(`${method} ${path} has no JSON body to check`);
  const parsed = endpoint!.response.safeParse(res.body);
  expect(parsed.success ? null : parsed.error.issues, `${method} ${url} fits the contract`).toBeNull();
  expect(parsed.data, `${method} ${url} sends nothing the contract leaves out`).toEqual(res.body);
  checked.add(`${method} ${endpoint!.path}`);
  return res.body;
}
const get = (c: Client, url: string) => conforms("GET", url, c.get(url));
const post = (c: Client, url: string, body?: object) => conforms("POST", url, c.post(url, body));
const patch = (c: Client, url: string, body?: object) => conforms("PATCH", url, c.patch(url, body));

function weekdayAhead(days: number): string {
  const d = new Date(Date.now() + days * 86_400_000);
  while (d.getUTCDay() === 0 || d.getUTCDay() === 6) d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

describe("the server's replies fit the API contract", () => {
  it("health, sign-in and the signed-in user", async () => {
    await conforms("GET", "/api/health", (await anonymousClient(t.app)).get("/api/health"));
    await get(await anonymousClient(t.app), "/api/auth/csrf");
    const fresh = await anonymousClient(t.app);
    await post(fresh, "/api/auth/login", { email: landlord.officer.email, password: PASSWORD });
    await get(officer, "/api/auth/me");
    await get(tenant, "/api/auth/me");
  });

  it("the tenant's home, report, photos, readings, cases and evaluation", async () => {
    const home = await get(tenant, "/api/me/home");
    roomId = home.property.rooms[0].id;
    const created = await post(tenant, "/api/cases", {
      description: "Black mould on the bedroom wall behind the wardrobe.",
      locations: ["behind-furniture"],
      observations: ["mould-spots"],
      roomIds: [roomId],
      vulnerability: ["children-under-15"],
      equipment: { heatingUsable: "yes" },
    });
    caseId = created.id;
    await get(tenant, `/api/cases/${caseId}`);
    const upload = tenant.agent
      .post(`/api/cases/${caseId}/photos`)
      .set("X-CSRF-Token", tenant.csrf)
      .attach("photos", await jpegWithGps(), "wall.jpg");
    await conforms("POST", `/api/cases/${caseId}/photos`, upload);
    await get(tenant, `/api/cases/${caseId}/photos`);
    await post(tenant, `/api/cases/${caseId}/readings`, [
      {
        roomId,
        takenAt: "2026-11-30T07:00:00Z",
        airTemperatureC: 17.5,
        relativeHumidityPct: 78,
        surfaceTemperatureC: 12.1,
        outdoorTemperatureC: 4,
      },
      { roomId, takenAt: "2026-11-30T08:00:00Z", airTemperatureC: 18, relativeHumidityPct: 75 },
    ]);
    const csv = Buffer.from(
      "Time,Temperature,RH\n2026-11-01 08:00,19.5,72\n2026-11-01 09:00,19.8,70\n2026-11-01 10:00,20.1,69\n",
    );
    await conforms(
      "POST",
      `/api/cases/${caseId}/readings/import/preview`,
      tenant.agent
        .post(`/api/cases/${caseId}/readings/import/preview`)
        .set("X-CSRF-Token", tenant.csrf)
        .attach("file", csv, "logger.csv"),
    );
    await conforms(
      "POST",
      `/api/cases/${caseId}/readings/import`,
      tenant.agent
        .post(`/api/cases/${caseId}/readings/import`)
        .set("X-CSRF-Token", tenant.csrf)
        .field("roomId", String(roomId))
        .attach("file", csv, "logger.csv"),
    );
    const readings = await get(tenant, `/api/cases/${caseId}/readings`);
    expect(readings.readings.length).toBe(5);
    const evaluation = await get(officer, `/api/cases/${caseId}/evaluation`);
    expect(evaluation.rooms[0].series).not.toBeNull();
    await get(tenant, "/api/me/cases");
    await get(tenant, `/api/cases/${caseId}/events`);
    await get(officer, `/api/cases/${caseId}/events`);
  });

  it("the officer's queue, case changes, triage, related cases, inspections, assessments and deadlines", async () => {
    await get(officer, "/api/cases?page=1&pageSize=10");
    await get(officer, "/api/staff");
    await patch(officer, `/api/cases/${caseId}`, {
      status: "triaged",
      hazardClass: "significant",
      reason: "Mould where a child sleeps.",
    });
    await post(officer, "/api/cases/bulk", { ids: [caseId], assigneeId: landlord.officer.id });
    await get(officer, `/api/cases/${caseId}/triage`);
    await get(officer, `/api/cases/${caseId}/related`);
    await post(officer, `/api/cases/${caseId}/inspections`, {
      inspectedAt: new Date(Date.now() - 3_600_000).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Cold corner behind the wardrobe; extract fan in the bathroom not working.",
      roomReadings: [
        {
          roomId,
          airTemperatureC: 18,
          relativeHumidityPct: 74,
          surfaceTemperaturesC: [12.5],
          moisture: { value: 18, unit: "wme" },
          note: "Behind the wardrobe.",
        },
      ],
    });
    await get(officer, `/api/cases/${caseId}/inspections`);
    await post(officer, `/api/cases/${caseId}/assessments`, {
      likelihood: 180,
      spread: [0, 0.2, 10, 89.8],
      justification: "Young child in the home; mould in the bedroom.",
    });
    await get(officer, `/api/cases/${caseId}/assessments`);
    await post(officer, `/api/cases/${caseId}/summary`, {
      body: "We found condensation mould in the bedroom and will fit a new extract fan.",
    });
    await post(officer, `/api/cases/${caseId}/messages`, { body: "Internal: ask the lead about the fan.", internal: true });
    await post(tenant, `/api/cases/${caseId}/messages`, { body: "The fan still does not run." });
    await get(officer, `/api/cases/${caseId}/messages`);
    await get(officer, "/api/me/unread-messages");
    await post(officer, `/api/cases/${caseId}/messages/read`, {});
    await get(tenant, `/api/cases/${caseId}/messages`);
    await get(tenant, "/api/me/unread-messages");
    await get(officer, `/api/cases/${caseId}/deadlines`);
  });

  it("work orders, contractors and the verification, for staff and for the tenant", async () => {
    const order = await post(officer, `/api/cases/${caseId}/work-orders`, {
      type: "extractor-fan",
      description: "Replace the bathroom extract fan.",
      roomIds: [roomId],
      priority: "urgent",
    });
    workOrderId = order.id;
    await patch(lead, `/api/work-orders/${workOrderId}`, {
      assigneeId: landlord.maintenance.id,
      slot: { date: weekdayAhead(14), window: "am" },
    });
    await post(tenant, `/api/work-orders/${workOrderId}/booking-response`, { response: "confirm" });
    await get(lead, "/api/work-orders?page=1&pageSize=10");
    await get(lead, `/api/cases/${caseId}/work-orders`);
    await get(tenant, `/api/cases/${caseId}/work-orders`);
    await post(lead, "/api/contractors", {
      name: "Fenwick Ventilation",
      email: "jobs@fenwick.example.org",
      trade: "ventilation",
    });
    await get(lead, "/api/contractors");
    await patch(lead, `/api/work-orders/${workOrderId}`, {
      complete: {
        note: "New fan fitted and tested.",
        materials: "Humidistat fan",
        minutesOnSite: 90,
        doneOn: localDate(testClock.now()),
        earlyReason: "The tenant asked us to come in earlier, on a cancelled slot.",
      },
    });
    const photos = lead.agent
      .post(`/api/work-orders/${workOrderId}/photos`)
      .set("X-CSRF-Token", lead.csrf)
      .attach("photos", await jpegWithGps(800, 600, 7), "after.jpg");
    await conforms("POST", `/api/work-orders/${workOrderId}/photos`, photos);
    await get(lead, `/api/cases/${caseId}/work-orders`);
    await get(tenant, `/api/cases/${caseId}/work-orders`);
    await get(lead, `/api/cases/${caseId}/verification`);
    await get(tenant, `/api/cases/${caseId}/verification`);
  });

  it("policy, homes and accounts", async () => {
    await get(officer, "/api/policy");
    await conforms(
      "PUT",
      "/api/policy",
      admin.agent.put("/api/policy").set("X-CSRF-Token", admin.csrf).send({
        emergencyMakeSafeHours: 24,
        investigateWorkingDays: 8,
        summaryWorkingDays: 3,
        safetyWorkWorkingDays: 5,
        supplementaryWorkWeeks: 12,
        monitoringDays: 21,
      }),
    );
    await conforms("DELETE", "/api/policy", admin.agent.delete("/api/policy").set("X-CSRF-Token", admin.csrf));
    await get(officer, "/api/properties?page=1&pageSize=10");
    await get(officer, "/api/properties/estates");
    await get(officer, `/api/properties/${landlord.home.id}`);
    await get(admin, "/api/users?page=1&pageSize=10");
    await patch(admin, `/api/users/${landlord.maintenance.id}`, { status: "disabled" });
    await post(admin, "/api/auth/invitations", { name: "Sam Oduya", email: `sam.${Date.now()}@example.org`, role: "officer" });
    await post(await anonymousClient(t.app), "/api/auth/password-reset", { email: "nobody@example.org" });
  });

  it("a home's page and an admin's changes to homes and rooms", async () => {
    const id = landlord.home.id;
    await get(officer, `/api/properties/${id}/tenants`);
    await get(officer, `/api/properties/${id}/cases`);
    await get(officer, `/api/properties/${id}/readings`);
    const home = await post(admin, "/api/properties", {
      addressLine1: "Flat 4, Contract House",
      town: "Testford",
      postcode: "ZX1 4CC",
      estate: "Contract Estate",
      builtForm: "flat",
      wallType: "system-built",
      glazingType: "single",
      heatingType: "district",
      rooms: [{ name: "Kitchen", kind: "kitchen" }],
    });
    await patch(admin, `/api/properties/${home.id}`, { ventilation: "piv" });
    const room = await post(admin, `/api/properties/${home.id}/rooms`, { name: "Loft", kind: "other" });
    await patch(admin, `/api/properties/${home.id}/rooms/${room.id}`, { name: "Loft room" });
    const removed = await admin.agent.delete(`/api/properties/${home.id}/rooms/${room.id}`).set("X-CSRF-Token", admin.csrf);
    expect(removed.status).toBe(204);
  });

  it("covered the main endpoints", () => {
    for (const route of [
      "GET /api/cases/:id",
      "GET /api/cases",
      "GET /api/work-orders",
      "GET /api/policy",
      "GET /api/auth/me",
      "GET /api/cases/:id/photos",
      "GET /api/cases/:id/readings",
      "GET /api/cases/:id/evaluation",
      "GET /api/cases/:id/verification",
    ]) {
      expect(checked).toContain(route);
    }
  });
});
