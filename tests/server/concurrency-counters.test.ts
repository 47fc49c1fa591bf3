// Counters bumped at the same moment (issue 16): each bump is `x = x + 1` in SQL, so twenty at once
// on separate connections count twenty, and DB_SYNC_WAIT reaches every pooled connection.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config/env.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { emailHash, SignInThrottleService } from "../../server/modules/auth/sign-in-throttle.service.js";
import { SignInThrottle } from "../../server/modules/auth/sign-in-throttle.entity.js";
import { createTestApp, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe("counters bumped at once", () => {
  it("twenty failed sign-ins for one address at once count twenty, and the owner is told once", async () => {
    const email = `counted.${Date.now()}@test.example`;
    const throttle = new SignInThrottleService(t.ctx.dataSource, testClock, 5);
    const outcomes = await Promise.all(Array.from({ length: 20 }, () => throttle.failed(email)));
    const row = await t.ctx.dataSource.getRepository(SignInThrottle).findOneByOrFail({ emailHash: emailHash(email) });
    expect(row.failures).toBe(20);
    expect(outcomes.filter((o) => o.notifyOwner)).toHaveLength(1);
    // The wait is the one twenty failures earn (five minutes, the longest).
    expect(row.waitUntil!.getTime() - row.lastFailureAt!.getTime()).toBe(300_000);
  });

  it("of parallel tries once a wait is due, one goes ahead and the others are asked to wait", async () => {
    const email = `parallel.${Date.now()}@test.example`;
    const throttle = new SignInThrottleService(t.ctx.dataSource, testClock, 5);
    for (let i = 0; i < 5; i++) await throttle.failed(email);
    // The first wait has run out.
    await t.ctx.dataSource.getRepository(SignInThrottle).update(emailHash(email), { waitUntil: null });
    const claims = await Promise.all(Array.from({ length: 6 }, () => throttle.claim(email)));
    expect(claims.filter((c) => c === null)).toHaveLength(1);
    for (const c of claims.filter((x) => x !== null)) expect(c).toBeGreaterThan(0);
  });
});

describe("DB_SYNC_WAIT", () => {
  it("is read from the environment, 0 to 15, and unset by default", () => {
    expect(loadConfig({}).db.syncWait).toBeUndefined();
    expect(loadConfig({ DB_SYNC_WAIT: "1" }).db.syncWait).toBe(1);
    expect(() => loadConfig({ DB_SYNC_WAIT: "16" })).toThrow(/DB_SYNC_WAIT/);
  });

  it("when set, every pooled connection's session has it", async () => {
    const ds = createDataSource({ ...loadConfig().db, syncWait: 1 });
    await ds.initialize();
    try {
      const runners = Array.from({ length: 3 }, () => ds.createQueryRunner());
      try {
        // Three connections held at once: three distinct sessions of the pool.
        const seen = await Promise.all(
          runners.map(async (r) => (await r.query("SELECT @@SESSION.wsrep_sync_wait AS v, CONNECTION_ID() AS id"))[0]),
        );
        expect(new Set(seen.map((s: { id: number }) => Number(s.id))).size).toBe(3);
        expect(seen.map((s: { v: number }) => Number(s.v))).toEqual([1, 1, 1]);
      } finally {
        await Promise.all(runners.map((r) => r.release()));
      }
    } finally {
      await ds.destroy();
    }
  });
});
