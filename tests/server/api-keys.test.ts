// The integration API and its keys: an admin makes a key with scopes, sees its secret once, and can
// revoke it; a key reaches only its landlord's data, only through /api/v1, only with the scope each
// route names, within its own rate limit; its writes are audited. Against the real MariaDB.
import { createHash } from "node:crypto";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { API_SCOPES, ENDPOINTS, scopeOf, type ApiScope, type Endpoint } from "../../src/lib/contracts/index.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { hoursAgo } from "../support/test-clock.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let admin: Client;
let otherAdmin: Client;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let elsewhere: Awaited<ReturnType<typeof makeLandlord>>;
let caseId: number;
let otherCaseId: number;
let roomId: number;

const KEY_ROUTES = ENDPOINTS.filter((e) => e.path.startsWith("/api/v1/"));

async function makeKey(
  client: Client,
  scopes: readonly ApiScope[],
  name = "Housing system",
): Promise<{ id: number; secret: string }> {
  const res = await client.post("/api/integrations/api-keys", { name, scopes }).expect(201);
  return { id: res.body.id, secret: res.body.secret };
}

/** A request to the integration API with a key (no cookie, no CSRF token). */
function withKey(secret: string, method: string, url: string, body?: object) {
  const m = method.toLowerCase() as "get" | "post" | "put";
  const req = request(t.app)[m](url).set("Authorization", `Bearer ${secret}`);
  return m === "get" ? req : req.send(body ?? {});
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  elsewhere = await makeLandlord(ds);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, elsewhere.admin.email, PASSWORD);
  const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  const otherOfficer = await signedInClient(t.app, elsewhere.officer.email, PASSWORD);
  const home = (await officer.get(`/api/properties/${landlord.home.id}`).expect(200)).body;
  roomId = home.rooms[0].id;
  const report = (propertyId: number) => ({
    propertyId,
    channel: "phone",
    awareAt: hoursAgo(3).toISOString(),
    description: "Black mould in the corner of the bedroom ceiling.",
    locations: ["ceiling"],
    observations: ["mould-spots"],
  });
  caseId = (await officer.post("/api/cases", report(landlord.home.id)).expect(201)).body.id;
  otherCaseId = (await otherOfficer.post("/api/cases", report(elsewhere.home.id)).expect(201)).body.id;
});
afterAll(() => t.close());

/** Small valid requests, so a key with the scope is answered about the data, not refused. */
const BODIES: Record<string, () => object> = {
  "PUT /api/v1/homes/by-uprn/:uprn": () => ({
    addressLine1: "4 Lantern Row",
    town: "Testford",
    postcode: "zx1 1ab",
    estate: "Lantern Estate",
    builtForm: "mid-terrace",
    wallType: "solid-brick",
    glazingType: "modern-double",
    heatingType: "gas-boiler",
  }),
  "POST /api/v1/cases": () => ({
    propertyId: landlord.home.id,
    channel: "email",
    awareAt: hoursAgo(2).toISOString(),
    description: "Reported to the contact centre: mould behind the wardrobe.",
    locations: ["external-wall"],
    observations: ["mould-spots"],
  }),
  "POST /api/v1/cases/:id/readings": () => [
    { roomId, takenAt: hoursAgo(1).toISOString(), airTemperatureC: 18.5, relativeHumidityPct: 71 },
  ],
};
const concrete = (e: Endpoint) =>
  e.path
    .replace("/homes/by-uprn/:uprn", `/homes/by-uprn/${4_000_000 + Math.floor(Math.random() * 1_000_000)}`)
    .replace("/homes/:id", `/homes/${landlord.home.id}`)
    .replace("/cases/:id", `/cases/${caseId}`);
const label = (e: Endpoint) => `${e.method} ${e.path}`;

describe("API keys: scopes on every key route", () => {
  it("gives every route of the integration API a scope", () => {
    expect(KEY_ROUTES.length).toBeGreaterThanOrEqual(8);
    expect(KEY_ROUTES.filter((e) => !scopeOf(e)).map(label)).toEqual([]);
    for (const e of KEY_ROUTES) expect(BODIES[label(e)] !== undefined || e.method === "GET", label(e)).toBe(true);
  });

  it.each(KEY_ROUTES.map((e) => [label(e), e] as const))(
    "%s: refused (403, scope named) to a key with every other scope, answered to a key with its scope",
    async (_name, e) => {
      const scope = scopeOf(e)!;
      const without = await makeKey(
        admin,
        API_SCOPES.filter((s) => s !== scope),
        `Without ${scope}`,
      );
      const refused = await withKey(without.secret, e.method, concrete(e), BODIES[label(e)]?.());
      expect(refused.status).toBe(403);
      expect(refused.body.error.code).toBe("scope_missing");
      expect(refused.body.error.message).toContain(scope);

      const only = await makeKey(admin, [scope], `Only ${scope}`);
      const answered = await withKey(only.secret, e.method, concrete(e), BODIES[label(e)]?.());
      // The upsert answers 201 when it adds the home (as here: a new UPRN), 200 when it updates one.
      expect(answered.status, JSON.stringify(answered.body)).toBe(
        label(e) === "PUT /api/v1/homes/by-uprn/:uprn" ? 201 : e.status,
      );
    },
  );
});

describe("API keys: the secret", () => {
  it("is shown once, stored only as its SHA-256, and never listed", async () => {
    const created = await admin
      .post("/api/integrations/api-keys", { name: "Repairs contractor", scopes: ["works:read"] })
      .expect(201);
    const { id, secret } = created.body as { id: number; secret: string };
    expect(secret).toMatch(new RegExp(`^dwk_${id}_[A-Za-z0-9_-]{43}$`));
    expect(created.headers["cache-control"]).toBe("no-store");

    const list = await admin.get("/api/integrations/api-keys").expect(200);
    const listed = list.body.keys.find((k: { id: number }) => k.id === id);
    expect(listed).toMatchObject({ name: "Repairs contractor", scopes: ["works:read"], hint: `dwk_${id}_…`, revokedAt: null });
    expect(listed.createdBy.name).toBeTruthy();
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(-43));

    const [row] = (await t.ctx.dataSource.query("SELECT secret_hash FROM api_keys WHERE id = ?", [id])) as {
      secret_hash: string;
    }[];
    // Node's own SHA-256 of the random part, worked out here independently of the service.
    expect(row!.secret_hash).toBe(createHash("sha256").update(secret.slice(-43)).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(secret.slice(-43));
  });

  it("refuses (401) an unknown key, a wrong secret for a real id, a malformed header, and no header", async () => {
    const { id, secret } = await makeKey(admin, ["homes:read"]);
    const wrongSecret = `dwk_${id}_${"A".repeat(43)}`;
    for (const header of [`Bearer ${wrongSecret}`, `Bearer dwk_999999999_${secret.slice(-43)}`, secret, "Basic abc"]) {
      await request(t.app).get("/api/v1/homes").set("Authorization", header).expect(401);
    }
    await request(t.app).get("/api/v1/homes").expect(401);
  });

  it("is refused at once when revoked, and revoking again changes nothing", async () => {
    const { id, secret } = await makeKey(admin, ["homes:read"]);
    await withKey(secret, "GET", "/api/v1/homes").expect(200);
    const revoked = await admin.post(`/api/integrations/api-keys/${id}/revoke`).expect(200);
    expect(revoked.body.revokedAt).not.toBeNull();
    const res = await withKey(secret, "GET", "/api/v1/homes").expect(401);
    expect(res.body.error.code).toBe("unauthorised");
    const again = await admin.post(`/api/integrations/api-keys/${id}/revoke`).expect(200);
    expect(again.body.revokedAt).toBe(revoked.body.revokedAt);
  });

  it("stops working when the admin who made it is no longer an active admin", async () => {
    const { secret } = await makeKey(admin, ["homes:read"]);
    await withKey(secret, "GET", "/api/v1/homes").expect(200);
    const ds = t.ctx.dataSource;
    await ds.query("UPDATE users SET role = 'officer' WHERE id = ?", [landlord.admin.id]);
    try {
      await withKey(secret, "GET", "/api/v1/homes").expect(401);
    } finally {
      await ds.query("UPDATE users SET role = 'admin' WHERE id = ?", [landlord.admin.id]);
    }
    await withKey(secret, "GET", "/api/v1/homes").expect(200);
  });

  it("records when it was last used, at most once a minute", async () => {
    const { id, secret } = await makeKey(admin, ["homes:read"]);
    const lastUsed = async () =>
      ((await admin.get("/api/integrations/api-keys").expect(200)).body.keys as { id: number; lastUsedAt: string | null }[]).find(
        (k) => k.id === id,
      )!.lastUsedAt;
    expect(await lastUsed()).toBeNull();
    await withKey(secret, "GET", "/api/v1/homes").expect(200);
    const first = await lastUsed();
    expect(first).not.toBeNull();
    await withKey(secret, "GET", "/api/v1/homes").expect(200);
    expect(await lastUsed()).toBe(first);
  });
});

describe("API keys: one landlord's data only", () => {
  it("never reaches another landlord's homes, cases or work orders", async () => {
    const { secret } = await makeKey(admin, [...API_SCOPES]);
    await withKey(secret, "GET", `/api/v1/homes/${elsewhere.home.id}`).expect(404);
    await withKey(secret, "GET", `/api/v1/cases/${otherCaseId}`).expect(404);
    await withKey(secret, "POST", `/api/v1/cases/${otherCaseId}/readings`, BODIES["POST /api/v1/cases/:id/readings"]!()).expect(
      404,
    );
    await withKey(secret, "POST", "/api/v1/cases", { ...BODIES["POST /api/v1/cases"]!(), propertyId: elsewhere.home.id }).expect(
      404,
    );

    const homes = (await withKey(secret, "GET", "/api/v1/homes?pageSize=200").expect(200)).body;
    expect(homes.items.map((h: { id: number }) => h.id)).not.toContain(elsewhere.home.id);
    const cases = (await withKey(secret, "GET", "/api/v1/cases?pageSize=100").expect(200)).body;
    expect(cases.items.map((c: { id: number }) => c.id)).toContain(caseId);
    expect(cases.items.map((c: { id: number }) => c.id)).not.toContain(otherCaseId);
  });

  it("upserts by UPRN within its own landlord: another landlord's home with that UPRN is untouched", async () => {
    const uprn = String(100_000_000_000 + Math.floor(Math.random() * 1_000_000));
    const theirs = await makeProperty(t.ctx.dataSource, elsewhere.org, { uprn, town: "Elsewhere" });
    const { secret } = await makeKey(admin, ["homes:write", "homes:read"]);
    const body = BODIES["PUT /api/v1/homes/by-uprn/:uprn"]!();

    const created = await withKey(secret, "PUT", `/api/v1/homes/by-uprn/${uprn}`, {
      ...body,
      rooms: [{ name: "Lounge", kind: "living" }],
    }).expect(201);
    expect(created.body).toMatchObject({ uprn, postcode: "ZX1 1AB", town: "Testford" });
    expect(created.body.rooms.map((r: { name: string }) => r.name)).toEqual(["Lounge"]);
    const updated = await withKey(secret, "PUT", `/api/v1/homes/by-uprn/${uprn}`, { ...body, town: "Newtown" }).expect(200);
    expect(updated.body).toMatchObject({ id: created.body.id, town: "Newtown" });
    const again = await withKey(secret, "PUT", `/api/v1/homes/by-uprn/${uprn}`, { ...body, town: "Newtown" }).expect(200);
    expect(again.body.id).toBe(created.body.id);

    const rows = (await t.ctx.dataSource.query("SELECT organisation_id, town FROM properties WHERE uprn = ? ORDER BY id", [
      uprn,
    ])) as {
      organisation_id: number;
      town: string;
    }[];
    expect(rows).toEqual([
      { organisation_id: elsewhere.org.id, town: "Elsewhere" },
      { organisation_id: landlord.org.id, town: "Newtown" },
    ]);
    expect(theirs.id).not.toBe(created.body.id);

    await withKey(secret, "PUT", "/api/v1/homes/by-uprn/12AB", body).expect(400);
    await withKey(secret, "PUT", "/api/v1/homes/by-uprn/1234567890123", body).expect(400);
  });
});

describe("API keys and sessions stay apart", () => {
  it("a key does not sign in on session routes, a session does not on key routes", async () => {
    const { secret } = await makeKey(admin, [...API_SCOPES]);
    await request(t.app).get("/api/properties").set("Authorization", `Bearer ${secret}`).expect(401);
    await request(t.app).get("/api/auth/me").set("Authorization", `Bearer ${secret}`).expect(401);
    await admin.get("/api/v1/homes").expect(401);
    await admin.post("/api/v1/cases", BODIES["POST /api/v1/cases"]!()).expect(401);
  });

  it("needs no CSRF token for a write with a key, and logs the report as staff would", async () => {
    const { secret } = await makeKey(admin, ["cases:write", "cases:read"], "Contact centre");
    const created = await withKey(secret, "POST", "/api/v1/cases", BODIES["POST /api/v1/cases"]!()).expect(201);
    expect(created.body).toMatchObject({ channel: "email", status: "new" });
    const got = await withKey(secret, "GET", `/api/v1/cases/${created.body.id}`).expect(200);
    expect(got.body.id).toBe(created.body.id);
    const added = await withKey(
      secret,
      "POST",
      `/api/v1/cases/${created.body.id}/readings`,
      BODIES["POST /api/v1/cases/:id/readings"]!(),
    ).expect(201);
    expect(added.body.imported).toBe(1);
    // A room of another home is refused, with the room named, and nothing is added.
    const stranger = await withKey(secret, "POST", `/api/v1/cases/${created.body.id}/readings`, [
      { roomId: 999_999, takenAt: hoursAgo(1).toISOString(), airTemperatureC: 18, relativeHumidityPct: 70 },
    ]).expect(400);
    expect(stranger.body.error.message).toContain("roomId");
  });

  it("audits every write made with a key, refusals included, for the admin to see", async () => {
    const { id, secret } = await makeKey(admin, ["cases:read"], "Audited system");
    await withKey(secret, "POST", "/api/v1/cases", BODIES["POST /api/v1/cases"]!()).expect(403);
    const { secret: writer, id: writerId } = await makeKey(admin, ["cases:write"], "Audited writer");
    await withKey(writer, "POST", "/api/v1/cases", BODIES["POST /api/v1/cases"]!()).expect(201);
    await withKey(writer, "GET", "/api/v1/work-orders").expect(403); // reads are not audited

    const entries = async () =>
      (await admin.get("/api/integrations/api-keys/audit").expect(200)).body.entries as {
        key: { id: number; name: string };
        method: string;
        path: string;
        status: number;
      }[];
    await expect
      .poll(async () => (await entries()).filter((e) => e.key.id === id || e.key.id === writerId))
      .toEqual(
        expect.arrayContaining([
          expect.objectContaining({ key: { id, name: "Audited system" }, method: "POST", path: "/api/v1/cases", status: 403 }),
          expect.objectContaining({
            key: { id: writerId, name: "Audited writer" },
            method: "POST",
            path: "/api/v1/cases",
            status: 201,
          }),
        ]),
      );
    expect((await entries()).filter((e) => e.key.id === writerId)).toHaveLength(1);
    // Another landlord's admin sees none of it.
    const theirs = (await otherAdmin.get("/api/integrations/api-keys/audit").expect(200)).body.entries as {
      key: { id: number };
    }[];
    expect(theirs.filter((e) => e.key.id === id || e.key.id === writerId)).toEqual([]);
    await otherAdmin.post(`/api/integrations/api-keys/${id}/revoke`).expect(404);
  });
});

describe("API keys: rate limit per key", () => {
  let limited: TestApp;
  beforeAll(async () => {
    limited = await createTestApp({ API_KEY_REQUESTS_PER_MINUTE: "3" });
  });
  afterAll(() => limited.close());

  it("answers 429 with Retry-After once a key has used its minute, and other keys carry on", async () => {
    const client = await signedInClient(limited.app, landlord.admin.email, PASSWORD);
    const a = await makeKey(client, ["homes:read"], "Busy system");
    const b = await makeKey(client, ["homes:read"], "Quiet system");
    const call = (secret: string) => request(limited.app).get("/api/v1/homes").set("Authorization", `Bearer ${secret}`);
    for (let i = 0; i < 3; i++) await call(a.secret).expect(200);
    const over = await call(a.secret).expect(429);
    expect(Number(over.headers["retry-after"])).toBeGreaterThanOrEqual(1);
    expect(over.body.error.code).toBe("too_many_requests");
    await call(b.secret).expect(200);
  });
});

describe("API keys in the OpenAPI document", () => {
  it("describes the bearer key and gives each key route its scope", async () => {
    const doc = (await admin.get("/api/openapi.json").expect(200)).body;
    expect(doc.components.securitySchemes.apiKey).toMatchObject({ type: "http", scheme: "bearer" });
    for (const e of KEY_ROUTES) {
      const op = doc.paths[e.path.replace(/:([A-Za-z]+)/g, "{$1}")][e.method.toLowerCase()];
      expect(op.security, label(e)).toEqual([{ apiKey: [scopeOf(e)] }]);
    }
    expect(doc.paths["/api/properties"].get.security).toEqual([{ session: [] }]);
  });
});
