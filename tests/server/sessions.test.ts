// Sessions end when they should (a password reset, a role change, an account disabled) and are
// written only when they change: a signed-in read does not rewrite the session row.
import request from "supertest";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { createClockedApp } from "../support/clocked-app.js";
import { anonymousClient, createTestApp, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;

/** Signs in and tells the session id too (the cookie's value, unsigned). */
async function signIn(app: TestApp["app"], email: string, password = PASSWORD) {
  const client = await anonymousClient(app);
  const res = await client.post("/api/auth/login", { email, password }).expect(200);
  client.csrf = res.body.csrfToken;
  const cookie = (res.headers["set-cookie"] as unknown as string[]).find((c) => c.startsWith("dewline.sid="))!;
  const sid = /^s:([^.]+)\./.exec(decodeURIComponent(/dewline\.sid=([^;]+)/.exec(cookie)![1]!))![1]!;
  return { client, sid };
}

const sessionUser = "COALESCE(JSON_VALUE(data, '$.passport.user.id'), JSON_VALUE(data, '$.passport.user'))";
const storedSessions = async (ctx: TestApp["ctx"], userId: number) =>
  (await ctx.dataSource.query(`SELECT session_id FROM sessions WHERE ${sessionUser} = ?`, [String(userId)])) as {
    session_id: string;
  }[];
const sessionRow = async (ctx: TestApp["ctx"], sid: string) =>
  (
    (await ctx.dataSource.query("SELECT session_id, expires, data FROM sessions WHERE session_id = ?", [sid])) as {
      session_id: string;
      expires: number;
      data: string;
    }[]
  )[0];

const resetLink = async (email: string) => {
  const anon = await anonymousClient(t.app);
  await anon.post("/api/auth/password-reset", { email }).expect(202);
  await t.ctx.services.auth.settled();
  const match = /http:\/\/dewline\.test\/reset-password\/([A-Za-z0-9_-]{43})/.exec((await t.mail.lastTo(email)).raw);
  return match![1]!;
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  admin = (await signIn(t.app, landlord.admin.email)).client;
});
afterAll(() => t.close());

describe("a password reset ends the account's other sessions", () => {
  it("signs out every other browser, even one whose session row is written back by a request in flight", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const laptop = await signIn(t.app, person.email);
    const phone = await signIn(t.app, person.email);
    await phone.client.get("/api/auth/me").expect(200);
    const phoneRow = await sessionRow(t.ctx, phone.sid);

    const token = await resetLink(person.email);
    const anon = await anonymousClient(t.app);
    await anon.post("/api/auth/password-reset/confirm", { token, password: "a brand new password" }).expect(204);

    await laptop.client.get("/api/auth/me").expect(401);
    await phone.client.get("/api/auth/me").expect(401);
    expect(await storedSessions(t.ctx, person.id)).toEqual([]);
    // A request of the phone's that was running during the reset saves its session at its end: still signed out.
    await t.ctx.dataSource.query("INSERT INTO sessions (session_id, expires, data) VALUES (?, ?, ?)", [
      phoneRow!.session_id,
      phoneRow!.expires,
      phoneRow!.data,
    ]);
    await phone.client.get("/api/auth/me").expect(401);
    await signIn(t.app, person.email, "a brand new password");
  });

  it("keeps the browser that made the reset signed in, and only that one", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "maintenance");
    const here = await signIn(t.app, person.email);
    const elsewhere = await signIn(t.app, person.email);
    const token = await resetLink(person.email);
    await here.client.post("/api/auth/password-reset/confirm", { token, password: "another new password" }).expect(204);
    await here.client.get("/api/auth/me").expect(200);
    await elsewhere.client.get("/api/auth/me").expect(401);
    expect((await storedSessions(t.ctx, person.id)).map((r) => r.session_id)).toEqual([here.sid]);
  });
});

describe("a role change and a disabled account end the person's sessions", () => {
  it("signs a person out everywhere when an admin changes their role; they sign in again with the new role", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const session = await signIn(t.app, person.email);
    const row = await sessionRow(t.ctx, session.sid);
    await admin.patch(`/api/users/${person.id}`, { role: "maintenance" }).expect(200);
    await session.client.get("/api/auth/me").expect(401);
    expect(await storedSessions(t.ctx, person.id)).toEqual([]);
    await t.ctx.dataSource.query("INSERT INTO sessions (session_id, expires, data) VALUES (?, ?, ?)", [
      row!.session_id,
      row!.expires,
      row!.data,
    ]);
    await session.client.get("/api/auth/me").expect(401);
    const again = await signIn(t.app, person.email);
    expect((await again.client.get("/api/auth/me").expect(200)).body.role).toBe("maintenance");
  });

  it("a name change alone leaves the person signed in", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const session = await signIn(t.app, person.email);
    await admin.patch(`/api/users/${person.id}`, { name: "New Name" }).expect(200);
    expect((await session.client.get("/api/auth/me").expect(200)).body.name).toBe("New Name");
  });

  it("a disabled account's session stays ended even if its row is written back", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const session = await signIn(t.app, person.email);
    const row = await sessionRow(t.ctx, session.sid);
    await admin.patch(`/api/users/${person.id}`, { status: "disabled" }).expect(200);
    await admin.patch(`/api/users/${person.id}`, { status: "active" }).expect(200);
    await t.ctx.dataSource.query("INSERT INTO sessions (session_id, expires, data) VALUES (?, ?, ?)", [
      row!.session_id,
      row!.expires,
      row!.data,
    ]);
    await session.client.get("/api/auth/me").expect(401);
  });
});

describe("sessions are written only when they change", () => {
  afterEach(() => {
    vi.useRealTimers();
  });

  it("leaves the session row alone on signed-in reads within a minute, and extends it once a minute has passed", async () => {
    // The session cookie's expiry comes from Date; the app's clock reads Date too, so both move together.
    vi.useFakeTimers({ toFake: ["Date"], now: new Date("2031-03-04T10:00:00Z") });
    const app = await createClockedApp({ now: () => new Date() });
    try {
      const person = await makeUser(app.ctx.dataSource, landlord.org, "officer");
      const { client, sid } = await signIn(app.app, person.email);
      const first = await sessionRow(app.ctx, sid);

      vi.setSystemTime(new Date("2031-03-04T10:00:30Z"));
      await client.get("/api/auth/me").expect(200);
      const read = await client.get("/api/cases").expect(200);
      expect(read.headers["set-cookie"]).toBeUndefined();
      expect(await sessionRow(app.ctx, sid)).toEqual(first);

      vi.setSystemTime(new Date("2031-03-04T10:01:01Z"));
      const later = await client.get("/api/auth/me").expect(200);
      expect(later.headers["set-cookie"]?.[0]).toMatch(/dewline\.sid=/);
      const touched = await sessionRow(app.ctx, sid);
      expect(touched!.expires - first!.expires).toBe(61);

      // Anonymous reads never write a session either.
      const before = (await app.ctx.dataSource.query("SELECT COUNT(*) AS n FROM sessions")) as [{ n: number }];
      await request(app.app).get("/api/health").expect(200);
      await request(app.app).get("/api/auth/me").expect(401);
      const after = (await app.ctx.dataSource.query("SELECT COUNT(*) AS n FROM sessions")) as [{ n: number }];
      expect(Number(after[0].n)).toBe(Number(before[0].n));
    } finally {
      vi.useRealTimers();
      await app.close();
    }
  });
});
