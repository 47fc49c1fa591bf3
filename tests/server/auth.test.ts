import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { anonymousClient, createTestApp, signedInClient, type TestApp } from "../support/test-app.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
});
afterAll(() => t.close());

describe("sign-in", () => {
  it("signs in, returns the user without secrets, and /me answers with the same user", async () => {
    const client = await anonymousClient(t.app);
    const res = await client
      .post("/api/auth/login", { email: landlord.officer.email.toUpperCase(), password: PASSWORD })
      .expect(200);
    expect(res.body.user).toEqual({
      id: landlord.officer.id,
      email: landlord.officer.email,
      name: landlord.officer.name,
      role: "officer",
      organisationId: landlord.org.id,
      language: null,
    });
    expect(JSON.stringify(res.body)).not.toContain("passwordHash");
    const me = await client.get("/api/auth/me").expect(200);
    expect(me.body).toEqual(res.body.user);
  });

  it("sets an httpOnly, SameSite=Lax session cookie and regenerates the session at sign-in", async () => {
    const agent = request.agent(t.app);
    const csrf = await agent.get("/api/auth/csrf").expect(200);
    const before = csrf.headers["set-cookie"]?.[0] ?? "";
    expect(before).toMatch(/HttpOnly/i);
    expect(before).toMatch(/SameSite=Lax/i);
    expect(before).not.toMatch(/Secure/i); // plain HTTP here
    const login = await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf.body.csrfToken)
      .send({ email: landlord.admin.email, password: PASSWORD })
      .expect(200);
    const after = login.headers["set-cookie"]?.[0] ?? "";
    const id = (c: string) => /dewline\.sid=([^;]+)/.exec(c)?.[1];
    expect(id(after)).toBeTruthy();
    expect(id(after)).not.toBe(id(before));
    // The pre-sign-in token is gone with the old session; the new one works.
    await agent.post("/api/auth/logout").set("X-CSRF-Token", csrf.body.csrfToken).expect(403);
    await agent.post("/api/auth/logout").set("X-CSRF-Token", login.body.csrfToken).expect(204);
    await agent.get("/api/auth/me").expect(401);
  });

  it("marks the cookie Secure when the request came over HTTPS through a trusted proxy", async () => {
    const proxied = await createTestApp({ TRUST_PROXY: "1" });
    try {
      const res = await request(proxied.app).get("/api/auth/csrf").set("X-Forwarded-Proto", "https").expect(200);
      expect(res.headers["set-cookie"]?.[0]).toMatch(/; Secure/i);
    } finally {
      await proxied.close();
    }
  });

  it("gives 401 for a wrong password and the sixth quick try gets 429 with a short wait", async () => {
    const fresh = await createTestApp();
    try {
      const client = await anonymousClient(fresh.app);
      for (let i = 0; i < 5; i++) {
        const res = await client.post("/api/auth/login", { email: landlord.tenant.email, password: "not the password" });
        expect(res.status).toBe(401);
        expect(res.body.error.code).toBe("invalid_credentials");
      }
      const sixth = await client.post("/api/auth/login", { email: landlord.tenant.email, password: PASSWORD });
      expect(sixth.status).toBe(429);
      expect(Number(sixth.headers["retry-after"])).toBeGreaterThan(0);
      expect(Number(sixth.headers["retry-after"])).toBeLessThanOrEqual(30);
      expect(sixth.body.error.message).toMatch(/wait \d+ seconds/i);
    } finally {
      await fresh.close();
    }
  });

  it("does not count successful sign-ins towards the limit", async () => {
    const fresh = await createTestApp();
    try {
      for (let i = 0; i < 8; i++) await signedInClient(fresh.app, landlord.maintenance.email, PASSWORD);
      const client = await anonymousClient(fresh.app);
      for (let i = 0; i < 5; i++) {
        await client.post("/api/auth/login", { email: landlord.maintenance.email, password: "wrong" }).expect(401);
      }
      await client.post("/api/auth/login", { email: landlord.maintenance.email, password: PASSWORD }).expect(429);
    } finally {
      await fresh.close();
    }
  });

  it("limits per IP across accounts as well as per account (six times the per-account number)", async () => {
    const fresh = await createTestApp({ LOGIN_MAX_FAILURES: "2" });
    try {
      const client = await anonymousClient(fresh.app);
      for (let i = 0; i < 12; i++) {
        await client.post("/api/auth/login", { email: `nobody${i}@test.example`, password: "wrong" }).expect(401);
      }
      await client.post("/api/auth/login", { email: "someone.else@test.example", password: "wrong" }).expect(429);
    } finally {
      await fresh.close();
    }
  });

  it("refuses a disabled account with the same 401 as a wrong password", async () => {
    const disabled = await makeUser(t.ctx.dataSource, landlord.org, "officer", { status: "disabled" });
    const client = await anonymousClient(t.app);
    const res = await client.post("/api/auth/login", { email: disabled.email, password: PASSWORD }).expect(401);
    expect(res.body.error.code).toBe("invalid_credentials");
  });

  it("validates the sign-in body with messages that name the field", async () => {
    const client = await anonymousClient(t.app);
    const res = await client.post("/api/auth/login", { email: "not-an-address", password: "" }).expect(400);
    expect(res.body.error.code).toBe("validation_failed");
    expect(res.body.error.details.map((d: { field: string }) => d.field)).toEqual(expect.arrayContaining(["email", "password"]));
  });

  it("answers 400 for a body that is not JSON", async () => {
    const client = await anonymousClient(t.app);
    const res = await client.agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", client.csrf)
      .set("Content-Type", "application/json")
      .send("{nope")
      .expect(400);
    expect(res.body.error.code).toBe("invalid_json");
  });
});

describe("CSRF", () => {
  it("refuses a state-changing request without the token, with 403 and nothing changed", async () => {
    const agent = request.agent(t.app);
    await agent.get("/api/auth/csrf").expect(200);
    const res = await agent.post("/api/auth/login").send({ email: landlord.officer.email, password: PASSWORD }).expect(403);
    expect(res.body.error.code).toBe("csrf_invalid");
    await agent.get("/api/auth/me").expect(401);
  });

  it("refuses a wrong token", async () => {
    const agent = request.agent(t.app);
    await agent.get("/api/auth/csrf").expect(200);
    await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", "forged")
      .send({ email: landlord.officer.email, password: PASSWORD })
      .expect(403);
  });
});

describe("unknown routes and errors", () => {
  it("answers JSON 404 for an unknown API route", async () => {
    const res = await request(t.app).get("/api/no-such-thing").expect(404);
    expect(res.body.error).toEqual({ code: "not_found", message: expect.stringContaining("/api/no-such-thing") });
  });

  it("answers 401 on /me when signed out", async () => {
    const res = await request(t.app).get("/api/auth/me").expect(401);
    expect(res.body.error.code).toBe("unauthorised");
  });
});
