// Sign-in limits that slow guessing without letting anyone lock someone else out: a growing wait per
// account (never a long lock), an unlock link by e-mail for the account's owner, per-address limits
// that a rotating X-Forwarded-For cannot escape, and TRUST_PROXY that never trusts every hop.
import { afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config/env.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { createClockedApp, ManualClock } from "../support/clocked-app.js";
import { outboxRows } from "../support/outbox.js";
import { anonymousClient, createTestApp, type TestApp } from "../support/test-app.js";

let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let clock: ManualClock;
let t: TestApp;

// A fresh app (so fresh per-address counts) and a clock standing still for each test.
beforeEach(async () => {
  clock = new ManualClock();
  t = await createClockedApp(clock);
});
afterEach(() => t.close());
beforeAll(async () => {
  const setup = await createTestApp();
  landlord = await makeLandlord(setup.ctx.dataSource);
  await setup.close();
});

const unlockLink = (raw: string) => /http:\/\/dewline\.test\/unlock-sign-in\/([A-Za-z0-9_-]{43})/.exec(raw)?.[1];

describe("a growing wait per account, never a long lock", () => {
  it("asks for a short wait after five failures, doubling with each further failure up to five minutes", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const attacker = await anonymousClient(t.app);
    for (let i = 0; i < 5; i++) {
      await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(401);
    }
    const waits: number[] = [];
    for (let i = 0; i < 8; i++) {
      const held = await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(429);
      const wait = Number(held.headers["retry-after"]);
      // Tries during the wait are refused without being counted: the wait does not grow.
      const again = await attacker.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(429);
      expect(Number(again.headers["retry-after"])).toBe(wait);
      expect(held.body.error.message).toMatch(/wait|try again/i);
      waits.push(wait);
      clock.advance(wait * 1000);
      await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(401);
    }
    expect(waits).toEqual([30, 60, 120, 240, 300, 300, 300, 300]);

    // The owner, after the wait, signs in; that clears the count.
    clock.advance(300_000);
    const owner = await anonymousClient(t.app);
    await owner.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(200);
    const next = await anonymousClient(t.app);
    await next.post("/api/auth/login", { email: person.email, password: "guess" }).expect(401);
  });

  it("treats an address without an account exactly the same, and e-mails nobody", async () => {
    const email = `nobody.${Date.now()}@test.example`;
    const attacker = await anonymousClient(t.app);
    for (let i = 0; i < 5; i++) await attacker.post("/api/auth/login", { email, password: "guess" }).expect(401);
    const held = await attacker.post("/api/auth/login", { email, password: "guess" }).expect(429);
    expect(held.headers["retry-after"]).toBe("30");
    await t.ctx.services.auth.settled();
    expect(await outboxRows(t.ctx.dataSource, { to: email })).toEqual([]);
  });
});

describe("an unlock link by e-mail", () => {
  it("sends the owner one link; it lets them sign in from their browser at once, once, while the guesser still waits", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "tenant");
    const attacker = await anonymousClient(t.app);
    for (let i = 0; i < 5; i++) await attacker.post("/api/auth/login", { email: person.email, password: "guess" });
    for (let i = 0; i < 3; i++) {
      clock.advance(300_000);
      await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(401);
    }
    await t.ctx.services.auth.settled();
    const rows = await outboxRows(t.ctx.dataSource, { to: person.email, template: "signInUnlock" });
    expect(rows).toHaveLength(1);
    const mail = await t.mail.lastTo(person.email);
    expect(mail.raw).toMatch(/someone may have been trying/i);
    const token = unlockLink(mail.raw)!;
    expect(token).toBeTruthy();

    const owner = await anonymousClient(t.app);
    await owner.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(429);
    await owner.post("/api/auth/sign-in-unlock", { token }).expect(204);
    await owner.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(200);

    const again = await anonymousClient(t.app);
    await again.post("/api/auth/sign-in-unlock", { token }).expect(404);
    await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(401);
    for (let i = 0; i < 4; i++) await attacker.post("/api/auth/login", { email: person.email, password: "guess" });
    await attacker.post("/api/auth/login", { email: person.email, password: "guess" }).expect(429);
  });

  it("sends a link on request, answering the same whether or not the address has an account", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const anon = await anonymousClient(t.app);
    const known = await anon.post("/api/auth/sign-in-unlock/request", { email: person.email }).expect(202);
    const unknown = await anon.post("/api/auth/sign-in-unlock/request", { email: "no.one.here@test.example" }).expect(202);
    expect(unknown.body).toEqual(known.body);
    await t.ctx.services.auth.settled();
    expect(await outboxRows(t.ctx.dataSource, { to: person.email, template: "signInUnlock" })).toHaveLength(1);
    expect(await outboxRows(t.ctx.dataSource, { to: "no.one.here@test.example" })).toEqual([]);
    // Asking again straight away sends nothing more.
    await anon.post("/api/auth/sign-in-unlock/request", { email: person.email }).expect(202);
    await t.ctx.services.auth.settled();
    expect(await outboxRows(t.ctx.dataSource, { to: person.email, template: "signInUnlock" })).toHaveLength(1);
  });
});

describe("per-address limits", () => {
  it("with TRUST_PROXY=1 a rotating X-Forwarded-For does not escape the limit for the address", async () => {
    const proxied = await createTestApp({ TRUST_PROXY: "1", LOGIN_MAX_FAILURES: "2" });
    try {
      const client = await anonymousClient(proxied.app);
      // The client writes what it likes on the left; the proxy appends the address it saw.
      const attempt = (i: number) =>
        client.agent
          .post("/api/auth/login")
          .set("X-CSRF-Token", client.csrf)
          .set("X-Forwarded-For", `198.51.100.${i % 250}, 203.0.113.9`)
          .send({ email: `sprayed.${i}@test.example`, password: "guess" });
      const statuses: number[] = [];
      for (let i = 0; i < 14; i++) statuses.push((await attempt(i)).status);
      expect(statuses.slice(0, 12).every((s) => s === 401)).toBe(true);
      expect(statuses.slice(12)).toEqual([429, 429]);
      // Someone else behind another address is not affected.
      const other = await anonymousClient(proxied.app);
      await other.agent
        .post("/api/auth/login")
        .set("X-CSRF-Token", other.csrf)
        .set("X-Forwarded-For", "203.0.113.10")
        .send({ email: landlord.officer.email, password: PASSWORD })
        .expect(200);
    } finally {
      await proxied.close();
    }
  });

  it("lets the owner of an account in through a busy address with their unlock link", async () => {
    const busy = await createClockedApp(new ManualClock(), { LOGIN_MAX_FAILURES: "2" });
    try {
      const person = await makeUser(busy.ctx.dataSource, landlord.org, "officer");
      const shared = await anonymousClient(busy.app);
      for (let i = 0; i < 12; i++) await shared.post("/api/auth/login", { email: `x${i}@test.example`, password: "guess" });
      const blocked = await shared.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(429);
      expect(blocked.body.error.message).toMatch(/network/i);
      await shared.post("/api/auth/sign-in-unlock/request", { email: person.email }).expect(202);
      await busy.ctx.services.auth.settled();
      const token = unlockLink((await busy.mail.lastTo(person.email)).raw)!;
      await shared.post("/api/auth/sign-in-unlock", { token }).expect(204);
      await shared.post("/api/auth/login", { email: person.email, password: PASSWORD }).expect(200);
    } finally {
      await busy.close();
    }
  });
});

describe("TRUST_PROXY", () => {
  const base = { NODE_ENV: "test" } as NodeJS.ProcessEnv;
  it("takes a hop count or a list of proxy addresses, and is off by default", () => {
    expect(loadConfig(base).trustProxy).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: "false" }).trustProxy).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: "1" }).trustProxy).toBe(1);
    expect(loadConfig({ ...base, TRUST_PROXY: "2" }).trustProxy).toBe(2);
    expect(loadConfig({ ...base, TRUST_PROXY: "10.0.0.5, 10.1.0.0/16,loopback" }).trustProxy).toEqual([
      "10.0.0.5",
      "10.1.0.0/16",
      "loopback",
    ]);
  });

  it("refuses `true` (trust every hop) and nonsense with a clear message", () => {
    expect(() => loadConfig({ ...base, TRUST_PROXY: "true" })).toThrow(/TRUST_PROXY.*every.*hop count/i);
    expect(() => loadConfig({ ...base, TRUST_PROXY: "not-an-address" })).toThrow(/TRUST_PROXY/);
    expect(() => loadConfig({ ...base, TRUST_PROXY: "10.0.0.0/99" })).toThrow(/TRUST_PROXY/);
  });
});
