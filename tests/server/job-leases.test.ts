// Jobs that run once across instances: two "instances" (each its own connection pool and
// INSTANCE_NAME) start the same job against the run's MariaDB. The lease lets one run it at a time,
// keeps it with one instance while that one lives, passes it on when its holder dies without giving
// it back, and records a failed run while the next tick runs as usual. Rate limits count across apps.
// Leases here are short (hundreds of ms) so nothing waits on the real default; the tests wait for
// states (runs counted, rows written), never for a length of time.
import { randomBytes } from "node:crypto";
import { Writable } from "node:stream";
import type { DataSource } from "typeorm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config/env.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { JobLeases } from "../../server/lib/job-lease.js";
import { createLogger } from "../../server/lib/logger.js";
import { leasedJob, type RepeatingJobHandle } from "../../server/lib/repeating-job.js";
import { purgeExpiredRateLimitHits } from "../../server/middleware/rate-limit-store.js";
import { anonymousClient, createTestApp, type TestApp } from "../support/test-app.js";

const quiet = createLogger("silent");
let dsA: DataSource;
let dsB: DataSource;

beforeAll(async () => {
  const { db } = loadConfig();
  dsA = createDataSource(db);
  dsB = createDataSource(db);
  await Promise.all([dsA.initialize(), dsB.initialize()]);
});

afterAll(async () => {
  await Promise.all([dsA?.destroy(), dsB?.destroy()]);
});

/** A job name no other test (or file) uses. */
const jobName = (what: string) => `test-${what}-${randomBytes(4).toString("hex")}`;

async function until(condition: () => boolean | Promise<boolean>, what: string) {
  for (let i = 0; i < 600; i++) {
    if (await condition()) return;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`still waiting for ${what}`);
}

interface LeaseRow {
  holder: string | null;
  token: string | null;
  expires_at: Date;
  last_started_at: Date | null;
  last_finished_at: Date | null;
  last_error: string | null;
}

async function leaseRow(name: string): Promise<LeaseRow | undefined> {
  const rows: LeaseRow[] = await dsA.query(`SELECT * FROM job_leases WHERE name = ?`, [name]);
  return rows[0];
}

/** Runs of one job on both instances: who ran, and how many ran at once at most. */
function sharedRuns() {
  const state = { byInstance: { a: 0, b: 0 }, active: 0, mostAtOnce: 0 };
  const runFor =
    (instance: "a" | "b", work: () => Promise<void> = async () => {}) =>
    async () => {
      state.active += 1;
      state.mostAtOnce = Math.max(state.mostAtOnce, state.active);
      try {
        await work();
        state.byInstance[instance] += 1;
      } finally {
        state.active -= 1;
      }
    };
  return { state, runFor };
}

describe("a repeating job under a lease", () => {
  it("runs on one of two instances only, one run at a time", async () => {
    const name = jobName("one-only");
    const leasesA = new JobLeases(dsA, { holder: "instance-a", leaseMs: 2000 }, quiet);
    const leasesB = new JobLeases(dsB, { holder: "instance-b", leaseMs: 2000 }, quiet);
    const { state, runFor } = sharedRuns();
    const slow = () => new Promise<void>((r) => setTimeout(r, 20));
    const jobs: RepeatingJobHandle[] = [
      leasedJob(name, {
        run: runFor("a", slow),
        everyMs: 300,
        logger: quiet,
        failure: "a failed",
        leases: leasesA,
      }),
      leasedJob(name, {
        run: runFor("b", slow),
        everyMs: 300,
        logger: quiet,
        failure: "b failed",
        leases: leasesB,
      }),
    ];
    try {
      await until(() => state.byInstance.a + state.byInstance.b >= 5, "five runs");
    } finally {
      await Promise.all(jobs.map((j) => j.stop()));
    }
    // The first instance to take the job keeps it; the other never runs it while the first lives.
    expect(Math.min(state.byInstance.a, state.byInstance.b)).toBe(0);
    expect(state.mostAtOnce).toBe(1);
    const row = await leaseRow(name);
    expect(row?.holder).toBe(state.byInstance.a > 0 ? "instance-a" : "instance-b");
    // Given back after each run.
    expect(row?.token).toBeNull();
  });

  it("is taken over by another instance once a dead holder's lease has run out", async () => {
    const name = jobName("takeover");
    const leasesA = new JobLeases(dsA, { holder: "instance-a", leaseMs: 400 }, quiet);
    const leasesB = new JobLeases(dsB, { holder: "instance-b", leaseMs: 400 }, quiet);
    // Instance A takes the lease and dies: no renewal, no release.
    const dead = await leasesA.take(name, { everyMs: 50 });
    expect(dead).not.toBeNull();
    const held = (await leaseRow(name))!;
    expect(held.holder).toBe("instance-a");

    const { state, runFor } = sharedRuns();
    const job = leasedJob(name, {
      run: runFor("b"),
      everyMs: 50,
      logger: quiet,
      failure: "b failed",
      leases: leasesB,
    });
    try {
      await until(() => state.byInstance.b >= 1, "instance B to run the job");
    } finally {
      await job.stop();
    }
    const after = (await leaseRow(name))!;
    expect(after.holder).toBe("instance-b");
    // B started only once A's lease had expired (both times are the database's).
    expect(after.last_started_at!.getTime()).toBeGreaterThanOrEqual(held.expires_at.getTime());
    // The dead holder's token no longer renews anything.
    expect(await dead!.renew()).toBe(false);
  });

  it("is renewed while a long run lasts, so no other instance starts it meanwhile", async () => {
    const name = jobName("renewed");
    const leasesA = new JobLeases(dsA, { holder: "instance-a", leaseMs: 300 }, quiet);
    const leasesB = new JobLeases(dsB, { holder: "instance-b", leaseMs: 300 }, quiet);
    let finishA = () => {};
    const { state, runFor } = sharedRuns();
    const a = leasedJob(name, {
      run: runFor("a", () => new Promise<void>((r) => (finishA = r))),
      everyMs: 50,
      logger: quiet,
      failure: "a failed",
      leases: leasesA,
    });
    let tries = 0;
    const take = leasesB.take.bind(leasesB);
    leasesB.take = (...args) => {
      tries += 1;
      return take(...args);
    };
    const b = leasedJob(name, {
      run: runFor("b"),
      everyMs: 50,
      logger: quiet,
      failure: "b failed",
      leases: leasesB,
    });
    try {
      await until(() => state.active === 1, "A's run to start");
      const taken = (await leaseRow(name))!;
      // B keeps asking for longer than two lease lengths (the lease's expiry moves on meanwhile).
      await until(
        async () => tries >= 5 && (await leaseRow(name))!.expires_at.getTime() > taken.expires_at.getTime() + 600,
        "renewals",
      );
      expect(state.byInstance.b).toBe(0);
      expect(state.mostAtOnce).toBe(1);
    } finally {
      finishA();
      await Promise.all([a.stop(), b.stop()]);
    }
  });

  it("logs a failed run, records its error, and runs again at the next tick", async () => {
    const name = jobName("failing");
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk: Buffer, _enc, done) {
        lines.push(chunk.toString());
        done();
      },
    });
    const logger = createLogger("error", sink);
    const leases = new JobLeases(dsA, { holder: "instance-a", leaseMs: 1000 }, logger);
    let calls = 0;
    let errorSeenBySecondRun: string | null | undefined;
    const job = leasedJob(name, {
      everyMs: 50,
      logger,
      failure: "test job failed",
      leases,
      run: async () => {
        calls += 1;
        if (calls === 1) throw new Error("the first run fails");
        if (calls === 2) errorSeenBySecondRun = (await leaseRow(name))?.last_error;
      },
    });
    try {
      await until(() => calls >= 2, "a second run");
    } finally {
      await job.stop();
    }
    expect(errorSeenBySecondRun).toBe("the first run fails");
    expect(lines.some((l) => l.includes("test job failed") && l.includes(name))).toBe(true);
    const row = (await leaseRow(name))!;
    expect(row.last_error).toBeNull();
    expect(row.last_finished_at).not.toBeNull();
  });
});

describe("the lease itself", () => {
  it("is never held by two instances at once, however they race", async () => {
    const name = jobName("race");
    const instances = [
      new JobLeases(dsA, { holder: "instance-a", leaseMs: 5000 }, quiet),
      new JobLeases(dsB, { holder: "instance-b", leaseMs: 5000 }, quiet),
    ];
    let holding = 0;
    let mostAtOnce = 0;
    let taken = 0;
    await Promise.all(
      instances.flatMap((leases) =>
        Array.from({ length: 4 }, async () => {
          for (let i = 0; i < 15; i++) {
            const lease = await leases.take(name);
            if (!lease) continue;
            taken += 1;
            holding += 1;
            mostAtOnce = Math.max(mostAtOnce, holding);
            await new Promise((r) => setTimeout(r, 2));
            holding -= 1;
            await lease.release();
          }
        }),
      ),
    );
    expect(mostAtOnce).toBe(1);
    expect(taken).toBeGreaterThan(0);
  });
});

describe("rate limits shared by app instances", () => {
  let a: TestApp;
  let b: TestApp;
  let other: TestApp;

  beforeAll(async () => {
    // Two instances of one deployment count together (one scope); a third app counts on its own.
    const scope = `shared-${randomBytes(4).toString("hex")}:`;
    [a, b, other] = await Promise.all([
      createTestApp({ INSTANCE_NAME: "instance-a" }, undefined, undefined, { rateLimitScope: scope }),
      createTestApp({ INSTANCE_NAME: "instance-b" }, undefined, undefined, { rateLimitScope: scope }),
      createTestApp({ INSTANCE_NAME: "instance-c" }),
    ]);
  });
  afterAll(async () => {
    await Promise.all([a?.close(), b?.close(), other?.close()]);
  });

  it("counts ten password-reset requests split over two instances against one limit of ten", async () => {
    const [onA, onB, onOther] = await Promise.all([anonymousClient(a.app), anonymousClient(b.app), anonymousClient(other.app)]);
    const ask = (c: typeof onA) => c.post("/api/auth/password-reset", { email: "nobody@example.org" });
    for (let i = 0; i < 5; i++) {
      expect((await ask(onA)).status).not.toBe(429);
      expect((await ask(onB)).status).not.toBe(429);
    }
    const refusedA = await ask(onA);
    expect(refusedA.status).toBe(429);
    expect(refusedA.body.error.message).toMatch(/Too many password reset requests/);
    expect(Number(refusedA.headers["retry-after"])).toBeGreaterThan(0);
    expect((await ask(onB)).status).toBe(429);
    // Another deployment's (another test's) counts are its own.
    expect((await ask(onOther)).status).not.toBe(429);
  });
});

describe("ended rate-limit counts", () => {
  it("are purged, while a count whose window is still open stays", async () => {
    const tag = randomBytes(4).toString("hex");
    await dsA.query(
      `INSERT INTO rate_limit_hits (hit_key, hits, reset_at) VALUES (?, 3, NOW(3) - INTERVAL 2 MINUTE), (?, 3, NOW(3) + INTERVAL 1 MINUTE)`,
      [`purge-${tag}:ended`, `purge-${tag}:open`],
    );
    await purgeExpiredRateLimitHits(dsA);
    const left: { hit_key: string }[] = await dsA.query(`SELECT hit_key FROM rate_limit_hits WHERE hit_key LIKE ?`, [
      `purge-${tag}:%`,
    ]);
    expect(left.map((r) => r.hit_key)).toEqual([`purge-${tag}:open`]);
  });
});
