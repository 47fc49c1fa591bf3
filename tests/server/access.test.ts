import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, makeProperty, makeUser, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let ours: Awaited<ReturnType<typeof makeLandlord>>;
let theirs: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let tenant: Client;

beforeAll(async () => {
  t = await createTestApp();
  ours = await makeLandlord(t.ctx.dataSource);
  theirs = await makeLandlord(t.ctx.dataSource);
  await makeProperty(t.ctx.dataSource, ours.org, { estate: "North Field", addressLine1: "7 Heron Walk", postcode: "ZX4 2PQ" });
  await makeProperty(t.ctx.dataSource, ours.org, { estate: "North Field", addressLine1: "9 Heron Walk", postcode: "ZX4 2PR" });
  officer = await signedInClient(t.app, ours.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, ours.tenant.email, PASSWORD);
});
afterAll(() => t.close());

describe("who may see homes", () => {
  it("gives a signed-out visitor 401", async () => {
    await request(t.app).get("/api/properties").expect(401);
  });

  it("gives a tenant 403 on the staff-only property list and property page", async () => {
    const list = await tenant.get("/api/properties").expect(403);
    expect(list.body.error.code).toBe("role_not_allowed");
    await tenant.get(`/api/properties/${ours.home.id}`).expect(403);
    await tenant.get("/api/users").expect(403);
  });

  it("lists only the staff member's own organisation's homes, paginated", async () => {
    const res = await officer.get("/api/properties?pageSize=2&page=1").expect(200);
    expect(res.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(res.body.items).toHaveLength(2);
    const ids = (await officer.get("/api/properties?pageSize=200").expect(200)).body.items.map((p: { id: number }) => p.id);
    expect(ids).toContain(ours.home.id);
    expect(ids).not.toContain(theirs.home.id);
  });

  it("filters by estate and searches address and postcode (spaces ignored)", async () => {
    const byEstate = await officer.get("/api/properties?estate=North%20Field").expect(200);
    expect(byEstate.body.total).toBe(2);
    const byText = await officer.get("/api/properties?q=heron").expect(200);
    expect(byText.body.total).toBe(2);
    const byPostcode = await officer.get("/api/properties?q=zx42pq").expect(200);
    expect(byPostcode.body.items.map((p: { addressLine1: string }) => p.addressLine1)).toEqual(["7 Heron Walk"]);
    const estates = await officer.get("/api/properties/estates").expect(200);
    expect(estates.body.estates).toEqual(["North Field", "Test Estate"]);
  });

  it("shows a home with its rooms to staff, and 404 for another landlord's home", async () => {
    const res = await officer.get(`/api/properties/${ours.home.id}`).expect(200);
    expect(res.body.rooms.map((r: { kind: string }) => r.kind).sort()).toEqual(["bedroom", "kitchen"]);
    expect(res.body).not.toHaveProperty("organisationId");
    await officer.get(`/api/properties/${theirs.home.id}`).expect(404);
  });

  it("validates list parameters and ids", async () => {
    const big = await officer.get("/api/properties?pageSize=500").expect(400);
    expect(big.body.error.message).toMatch(/pageSize/);
    await officer.get("/api/properties?page=0").expect(400);
    const bad = await officer.get("/api/properties/abc").expect(400);
    expect(bad.body.error.details[0].field).toBe("id");
  });
});

describe("a tenant's own home", () => {
  it("returns the tenant's current home with rooms", async () => {
    const res = await tenant.get("/api/me/home").expect(200);
    expect(res.body.property.id).toBe(ours.home.id);
    expect(res.body.property.rooms).toHaveLength(2);
    expect(res.body.tenancy.startDate).toBe("2024-01-01");
  });

  it("is for tenants only", async () => {
    await officer.get("/api/me/home").expect(403);
  });

  it("answers 404 with a message when the tenancy has ended", async () => {
    const { Tenancy } = await import("../../server/modules/tenancies/tenancy.entity.js");
    const gone = await makeLandlord(t.ctx.dataSource);
    await t.ctx.dataSource.getRepository(Tenancy).update({ tenantUserId: gone.tenant.id }, { endDate: "2024-06-30" });
    const client = await signedInClient(t.app, gone.tenant.email, PASSWORD);
    const res = await client.get("/api/me/home").expect(404);
    expect(res.body.error.message).toMatch(/current tenancy/);
  });
});

describe("users (admin)", () => {
  it("lists the organisation's users for an admin and lets them disable one, who can then no longer sign in", async () => {
    const admin = await signedInClient(t.app, ours.admin.email, PASSWORD);
    const list = await admin.get("/api/users?role=maintenance").expect(200);
    expect(list.body.items.map((u: { email: string }) => u.email)).toEqual([ours.maintenance.email]);
    await officer.get("/api/users").expect(403);
    const res = await admin.patch(`/api/users/${ours.maintenance.id}`, { status: "disabled" }).expect(200);
    expect(res.body.status).toBe("disabled");
    await expect(signedInClient(t.app, ours.maintenance.email, PASSWORD)).rejects.toThrow(/401/);
    await admin.patch(`/api/users/${theirs.admin.id}`, { status: "disabled" }).expect(404);
    await admin.patch(`/api/users/${ours.admin.id}`, { status: "disabled" }).expect(409);
    await admin.patch(`/api/users/${ours.maintenance.id}`, { status: "deleted" }).expect(400);
  });

  it("ends the session of a user who is disabled while signed in", async () => {
    const admin = await signedInClient(t.app, ours.admin.email, PASSWORD);
    const officer2 = await makeUser(t.ctx.dataSource, ours.org, "officer");
    const client = await signedInClient(t.app, officer2.email, PASSWORD);
    await client.get("/api/auth/me").expect(200);
    await admin.patch(`/api/users/${officer2.id}`, { status: "disabled" }).expect(200);
    await client.get("/api/auth/me").expect(401);
  });
});
