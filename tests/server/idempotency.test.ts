// Idempotency-Key on POSTs that create something: a retry gets the first answer and creates nothing
// twice, even when the first answer was lost after the commit (the Galera case in GALERA.md).
import { randomUUID } from "node:crypto";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createApp } from "../../server/app.js";
import { DatabaseUnavailableError } from "../../server/lib/db-errors.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { png } from "../support/images.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { daysAgo, hoursAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let officer: Client;
let admin: Client;
let caseId: number;
let roomId: number;

const report = (description = "Black mould behind the wardrobe in the back bedroom.") => ({
  description,
  locations: ["ceiling"],
  observations: ["mould-spots"],
});

/** A report logged by staff (or through the integration API) for the landlord's home. */
const staffReport = () => ({
  ...report("Tenant phoned: mould in the bathroom again."),
  propertyId: landlord.home.id,
  channel: "phone",
  awareAt: hoursAgo(1).toISOString(),
});

/** A POST with a key and the CSRF token, as the client sends it. */
const post = (client: Client, url: string, key: string, body: object) =>
  client.agent.post(url).set("X-CSRF-Token", client.csrf).set("Idempotency-Key", key).send(body);

const count = async (sql: string, params: unknown[]) =>
  Number(((await t.ctx.dataSource.query(sql, params)) as { n: string | number }[])[0]!.n);
const casesReportedBy = (userId: number) => count("SELECT COUNT(*) AS n FROM cases WHERE reporter_user_id = ?", [userId]);
const keyRows = (key: string) => count("SELECT COUNT(*) AS n FROM idempotency_keys WHERE idem_key = ?", [key]);
const messagesOn = async (client: Client, id: number) =>
  ((await client.get(`/api/cases/${id}/messages`).expect(200)).body.messages as { body: string }[]).map((m) => m.body);

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  roomId = (await tenant.get("/api/me/home").expect(200)).body.property.rooms[0].id;
  caseId = (await tenant.post("/api/cases", { ...report(), roomIds: [roomId] }).expect(201)).body.id;
});
afterAll(() => t.close());

describe("the same key sent again", () => {
  it("creates one tenant report and answers the retry with the first answer, marked as replayed", async () => {
    const key = randomUUID();
    const before = await casesReportedBy(landlord.tenant.id);
    const first = await post(tenant, "/api/cases", key, report()).expect(201);
    expect(first.headers["idempotent-replayed"]).toBeUndefined();
    const again = await post(tenant, "/api/cases", key, report()).expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body).toEqual(first.body);
    expect(await casesReportedBy(landlord.tenant.id)).toBe(before + 1);
    expect(await keyRows(key)).toBe(1);
  });

  it("refuses the key with a different body (422) and changes nothing", async () => {
    const key = randomUUID();
    await post(tenant, "/api/cases", key, report()).expect(201);
    const before = await casesReportedBy(landlord.tenant.id);
    const other = await post(tenant, "/api/cases", key, report("The kitchen ceiling is wet above the hob.")).expect(422);
    expect(other.body.error.code).toBe("idempotency_key_reused");
    expect(other.body.error.message).toMatch(/different request/);
    expect(await casesReportedBy(landlord.tenant.id)).toBe(before);
  });

  it("refuses a key that is empty, too long or not plain ASCII (400) and creates nothing", async () => {
    const before = await casesReportedBy(landlord.tenant.id);
    for (const bad of ["x".repeat(101), "has space", "clé-été"]) {
      const res = await post(tenant, "/api/cases", bad, report()).expect(400);
      expect(res.body.error.message).toMatch(/Idempotency-Key/);
    }
    expect(await casesReportedBy(landlord.tenant.id)).toBe(before);
  });

  it("keeps each user's keys apart: another user's same key creates their own report", async () => {
    const key = randomUUID();
    await post(tenant, "/api/cases", key, report()).expect(201);
    const officerBefore = await casesReportedBy(landlord.officer.id);
    const staffCase = staffReport();
    const theirs = await post(officer, "/api/cases", key, staffCase);
    expect(theirs.status).toBe(201);
    expect(theirs.headers["idempotent-replayed"]).toBeUndefined();
    expect(await casesReportedBy(landlord.officer.id)).toBe(officerBefore + 1);
  });

  it("passes a request without the header through as before", async () => {
    const before = await casesReportedBy(landlord.tenant.id);
    await tenant.post("/api/cases", report()).expect(201);
    await tenant.post("/api/cases", report()).expect(201);
    expect(await casesReportedBy(landlord.tenant.id)).toBe(before + 2);
  });
});

describe("each kind of thing created", () => {
  it("a message: sent once", async () => {
    const key = randomUUID();
    const body = { body: `Still damp this morning ${key}` };
    const first = await post(tenant, `/api/cases/${caseId}/messages`, key, body).expect(201);
    const again = await post(tenant, `/api/cases/${caseId}/messages`, key, body).expect(201);
    expect(again.body).toEqual(first.body);
    expect((await messagesOn(tenant, caseId)).filter((m) => m === body.body)).toHaveLength(1);
  });

  it("hand readings: the retry is the first answer, not a report of duplicates", async () => {
    const key = randomUUID();
    const readings = [{ roomId, takenAt: daysAgo(3).toISOString(), airTemperatureC: 18.5, relativeHumidityPct: 81 }];
    const first = await post(tenant, `/api/cases/${caseId}/readings`, key, readings).expect(201);
    expect(first.body).toEqual({ imported: 1, duplicates: 0, rejected: 0 });
    const again = await post(tenant, `/api/cases/${caseId}/readings`, key, readings).expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body).toEqual({ imported: 1, duplicates: 0, rejected: 0 });
  });

  it("an inspection, then a work order (the booking of works): one of each", async () => {
    await officer
      .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: "Mould over a bed." })
      .expect(200);
    const inspectionKey = randomUUID();
    const inspection = {
      inspectedAt: hoursAgo(2).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: `Condensation mould above the window ${inspectionKey}`,
      roomReadings: [{ roomId, airTemperatureC: 18, relativeHumidityPct: 70 }],
    };
    const inspections = () => count("SELECT COUNT(*) AS n FROM inspections WHERE case_id = ?", [caseId]);
    const inspectionsBefore = await inspections();
    const firstInspection = await post(officer, `/api/cases/${caseId}/inspections`, inspectionKey, inspection).expect(201);
    const inspectionAgain = await post(officer, `/api/cases/${caseId}/inspections`, inspectionKey, inspection).expect(201);
    expect(inspectionAgain.body).toEqual(firstInspection.body);
    expect(await inspections()).toBe(inspectionsBefore + 1);

    const key = randomUUID();
    const orders = () => count("SELECT COUNT(*) AS n FROM work_orders WHERE case_id = ?", [caseId]);
    const before = await orders();
    const body = { type: "mould-wash", description: `Wash the bedroom wall ${key}` };
    const first = await post(officer, `/api/cases/${caseId}/work-orders`, key, body).expect(201);
    const again = await post(officer, `/api/cases/${caseId}/work-orders`, key, body).expect(201);
    expect(again.body).toEqual(first.body);
    expect(await orders()).toBe(before + 1);
  });

  it("a logger CSV import (multipart): imported once; the same key with another file is refused", async () => {
    const key = randomUUID();
    const csv = Buffer.from("Time,Temperature,RH\n2026-10-01 08:00,19.5,72\n2026-10-01 09:00,19.8,70\n");
    const send = (file: Buffer) =>
      tenant.agent
        .post(`/api/cases/${caseId}/readings/import`)
        .set("X-CSRF-Token", tenant.csrf)
        .set("Idempotency-Key", key)
        .field("roomId", String(roomId))
        .attach("file", file, "logger.csv");
    const first = await send(csv).expect(201);
    expect(first.body.imported).toBe(2);
    expect(await keyRows(key)).toBe(1);
    const again = await send(csv).expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body).toEqual(first.body);
    const other = await send(Buffer.from("Time,Temperature,RH\n2026-10-02 08:00,18.0,75\n")).expect(422);
    expect(other.body.error.code).toBe("idempotency_key_reused");
  });

  it("a stock import (its own hand-opened transaction): one import record", async () => {
    const key = randomUUID();
    const register = Buffer.from('UPRN;Address;Property Type\r\n100099990001;"3 Larch Row, Leeds, LS2 9ZZ";Flat\r\n', "utf8");
    const imports = () => count("SELECT COUNT(*) AS n FROM stock_imports WHERE organisation_id = ?", [landlord.org.id]);
    const before = await imports();
    const send = () =>
      admin.agent
        .post("/api/stock-imports")
        .set("X-CSRF-Token", admin.csrf)
        .set("Idempotency-Key", key)
        .attach("file", register, "register.csv");
    const first = await send().expect(201);
    const again = await send().expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body).toEqual(first.body);
    expect(await imports()).toBe(before + 1);
  });

  it("photos (multipart): the key is recorded with the photos' transaction, and a retry is the first answer", async () => {
    const key = randomUUID();
    const image = await png(320, 240);
    const send = () =>
      tenant.agent
        .post(`/api/cases/${caseId}/photos`)
        .set("X-CSRF-Token", tenant.csrf)
        .set("Idempotency-Key", key)
        .attach("photos", image, "wall.png");
    const first = await send().expect(201);
    expect(await keyRows(key)).toBe(1);
    const again = await send().expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body).toEqual(first.body);
  });

  it("an API key: its secret is shown once, so a retry says it was done and creates no second key", async () => {
    const key = randomUUID();
    const keys = () => count("SELECT COUNT(*) AS n FROM api_keys WHERE organisation_id = ?", [landlord.org.id]);
    const before = await keys();
    const body = { name: `Asset system ${key.slice(0, 8)}`, scopes: ["homes:read"] };
    await post(admin, "/api/integrations/api-keys", key, body).expect(201);
    const again = await post(admin, "/api/integrations/api-keys", key, body).expect(409);
    expect(again.body.error.code).toBe("already_applied");
    expect(again.body.error.message).toMatch(/secret is shown only once/);
    expect(JSON.stringify(again.body)).not.toMatch(/dwk_/);
    expect(await keys()).toBe(before + 1);
    const [row] = await t.ctx.dataSource.query("SELECT response_body FROM idempotency_keys WHERE idem_key = ?", [key]);
    expect(row.response_body).toBeNull();
  });

  it("the integration API (/v1): keyed per API key", async () => {
    const created = await admin
      .post("/api/integrations/api-keys", { name: "Contact centre", scopes: ["cases:write"] })
      .expect(201);
    const secret = created.body.secret as string;
    const key = randomUUID();
    const body = staffReport();
    const send = () =>
      request(t.app).post("/api/v1/cases").set("Authorization", `Bearer ${secret}`).set("Idempotency-Key", key).send(body);
    const first = await send().expect(201);
    const again = await send().expect(201);
    expect(again.headers["idempotent-replayed"]).toBe("true");
    expect(again.body.id).toBe(first.body.id);
    expect(await count("SELECT COUNT(*) AS n FROM idempotency_keys WHERE idem_key = ? AND scope_kind = 'api_key'", [key])).toBe(
      1,
    );
  });
});

describe("races and failures", () => {
  it("three requests with one key at once: one message, three equal answers", async () => {
    const key = randomUUID();
    const body = { body: `Three clicks on send ${key}` };
    const answers = await Promise.all([1, 2, 3].map(() => post(tenant, `/api/cases/${caseId}/messages`, key, body)));
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
    expect(new Set(answers.map((a) => a.body.id)).size).toBe(1);
    expect((await messagesOn(tenant, caseId)).filter((m) => m === body.body)).toHaveLength(1);
    expect(await keyRows(key)).toBe(1);
  });

  it("a failure after the key's insert rolls the key back with the write; the retry then creates it once", async () => {
    const key = randomUUID();
    const body = { body: `Rolled back once ${key}` };
    const spy = vi
      .spyOn(t.ctx.services.cases, "recordEvent")
      .mockRejectedValueOnce(new Error("forced failure inside the transaction"));
    await post(tenant, `/api/cases/${caseId}/messages`, key, body).expect(500);
    spy.mockRestore();
    expect(await keyRows(key)).toBe(0);
    expect((await messagesOn(tenant, caseId)).filter((m) => m === body.body)).toHaveLength(0);
    const retry = await post(tenant, `/api/cases/${caseId}/messages`, key, body).expect(201);
    expect(retry.headers["idempotent-replayed"]).toBeUndefined();
    expect((await messagesOn(tenant, caseId)).filter((m) => m === body.body)).toHaveLength(1);
  });

  it("committed but the answer lost (503): the retry is a clear 409 and nothing is created twice", async () => {
    const quick = createApp(t.ctx, { idempotencyWaitMs: 200 });
    const client = await signedInClient(quick, landlord.tenant.email, PASSWORD);
    const service = t.ctx.services.conversation;
    const original = service.postAsTenant.bind(service);
    const spy = vi.spyOn(service, "postAsTenant").mockImplementationOnce(async (...args) => {
      await original(...args);
      throw new DatabaseUnavailableError(); // as when the commit's OK packet never arrives
    });
    const key = randomUUID();
    const body = { body: `Sent during a failover ${key}` };
    await post(client, `/api/cases/${caseId}/messages`, key, body).expect(503);
    spy.mockRestore();
    const retry = await post(client, `/api/cases/${caseId}/messages`, key, body).expect(409);
    expect(retry.body.error.code).toBe("already_applied");
    expect(retry.body.error.message).toMatch(/already saved.*Refresh/);
    expect((await messagesOn(tenant, caseId)).filter((m) => m === body.body)).toHaveLength(1);
  });
});

describe("old keys", () => {
  it("are forgotten after a day: purged, and a key older than that counts as new", async () => {
    const key = randomUUID();
    await t.ctx.dataSource.query(
      "INSERT INTO idempotency_keys (scope_kind, scope_id, organisation_id, idem_key, method, path, request_hash, response_status, response_body, created_at) VALUES ('user', ?, ?, ?, 'POST', '/api/cases', ?, 201, '{}', ?)",
      [landlord.tenant.id, landlord.org.id, key, "0".repeat(64), hoursAgo(25)],
    );
    const fresh = await post(tenant, "/api/cases", key, report()).expect(201);
    expect(fresh.headers["idempotent-replayed"]).toBeUndefined();
    expect(await keyRows(key)).toBe(1);

    const stale = randomUUID();
    await t.ctx.dataSource.query(
      "INSERT INTO idempotency_keys (scope_kind, scope_id, organisation_id, idem_key, method, path, request_hash, created_at) VALUES ('user', ?, ?, ?, 'POST', '/api/cases', ?, ?)",
      [landlord.tenant.id, landlord.org.id, stale, "0".repeat(64), hoursAgo(25)],
    );
    expect(await t.ctx.services.idempotency.purgeExpired()).toBeGreaterThanOrEqual(1);
    expect(await keyRows(stale)).toBe(0);
    expect(await keyRows(key)).toBe(1);
  });
});
