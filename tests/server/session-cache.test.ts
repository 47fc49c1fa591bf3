// A signed-in request reads its session and account once per burst, not once per request
// (SESSION_CACHE_MS), and what this process changes (signing out, disabling, a new role) counts at once.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { RecentCache } from "../../server/lib/recent-cache.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { anonymousClient, createTestApp, signedInClient, type TestApp } from "../support/test-app.js";

describe("RecentCache", () => {
  /** A hand-moved monotonic clock and a loader that counts its reads and answers what `row` holds. */
  function setup(ttlMs = 1000) {
    let now = 1000; // lru-cache reads a start time of 0 as "no lifetime"
    const db = { row: "v1", reads: 0 };
    const cache = new RecentCache<string, string>(ttlMs, 100, () => now);
    const load = async () => {
      db.reads += 1;
      return db.row;
    };
    return { cache, db, load, advance: (ms: number) => (now += ms) };
  }

  it("answers from memory within its lifetime, and reads again after it", async () => {
    const { cache, db, load, advance } = setup();
    for (let i = 0; i < 5; i++) expect(await cache.get("k", load)).toBe("v1");
    expect(db.reads).toBe(1);
    db.row = "v2";
    advance(999);
    expect(await cache.get("k", load)).toBe("v1");
    advance(2);
    expect(await cache.get("k", load)).toBe("v2");
    expect(db.reads).toBe(2);
  });

  it("never puts back a value read before this process changed the key", async () => {
    const { cache, db, advance } = setup();
    let release!: () => void;
    const slowRead = cache.get(
      "k",
      () =>
        new Promise<string>((resolve) => {
          const old = db.row;
          release = () => resolve(old);
        }),
    );
    advance(10);
    db.row = "v2";
    cache.forget("k");
    release();
    expect(await slowRead).toBe("v1");
    // The old value read meanwhile was not kept: the next read sees the change.
    expect(await cache.get("k", async () => db.row)).toBe("v2");
  });

  it("keeps a key out for the hold-off after a change made in a transaction", async () => {
    const { cache, db, load, advance } = setup();
    await cache.get("k", load);
    cache.forget("k", 5000);
    advance(1);
    await cache.get("k", load);
    await cache.get("k", load);
    expect(db.reads).toBe(3);
    advance(5000);
    await cache.get("k", load);
    await cache.get("k", load);
    expect(db.reads).toBe(4);
  });

  it("keeps what this process wrote, and nothing at all with a lifetime of 0", async () => {
    const { cache, db, load } = setup();
    cache.put("k", "written");
    expect(await cache.get("k", load)).toBe("written");
    expect(db.reads).toBe(0);
    const off = setup(0);
    await off.cache.get("k", off.load);
    off.cache.put("k", "written");
    expect(await off.cache.get("k", off.load)).toBe("v1");
    expect(off.db.reads).toBe(2);
  });
});

describe("signed-in requests with the session cache", () => {
  let t: TestApp;
  let landlord: Awaited<ReturnType<typeof makeLandlord>>;
  beforeAll(async () => {
    // Long enough that nothing in this file outlives it by the clock: what changes must be forgotten.
    t = await createTestApp({ SESSION_CACHE_MS: "60000" });
    landlord = await makeLandlord(t.ctx.dataSource);
  });
  afterAll(() => t.close());

  const selects = async () =>
    Number(((await t.ctx.dataSource.query("SHOW GLOBAL STATUS LIKE 'Com_select'")) as { Value: string }[])[0]!.Value);

  it("reads the database about once for a burst of 20 requests, not twice per request", async () => {
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    await tenant.get("/api/auth/me").expect(200);
    const before = await selects();
    for (let i = 0; i < 20; i++) await tenant.get("/api/auth/me").expect(200);
    // Without the cache this is 40 (the session row and the account, per request).
    expect((await selects()) - before).toBeLessThan(5);
  });

  it("refuses a signed-out session's cookie at once", async () => {
    const tenant = await anonymousClient(t.app);
    const login = await tenant.post("/api/auth/login", { email: landlord.tenant.email, password: PASSWORD }).expect(200);
    tenant.csrf = login.body.csrfToken;
    const cookie = (login.headers["set-cookie"] as unknown as string[]).find((c) => c.startsWith("dewline.sid="))!.split(";")[0]!;
    await request(t.app).get("/api/auth/me").set("Cookie", cookie).expect(200);
    await tenant.post("/api/auth/logout").expect(204);
    await request(t.app).get("/api/auth/me").set("Cookie", cookie).expect(401);
  });

  it("shows a new role and refuses a disabled account's sessions at once", async () => {
    const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    expect((await officer.get("/api/auth/me").expect(200)).body.role).toBe("officer");
    await admin.patch(`/api/users/${landlord.officer.id}`, { role: "maintenance" }).expect(200);
    // A role change ends the person's sessions: the warm copy of the old one is not used.
    await officer.get("/api/auth/me").expect(401);
    const again = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    expect((await again.get("/api/auth/me").expect(200)).body.role).toBe("maintenance");
    await admin.patch(`/api/users/${landlord.officer.id}`, { status: "disabled" }).expect(200);
    await again.get("/api/auth/me").expect(401);
  });
});
