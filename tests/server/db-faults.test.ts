// A database that stalls (SIGSTOP), stops and comes back, against a MariaDB of this file's own (the
// shared test database is never stopped). While it is gone every API request is answered 503 with
// Retry-After instead of hanging or failing with 500, the calculator keeps answering, and the app
// recovers by itself when the database returns.
import { mkdtempSync, rmSync } from "node:fs";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Express } from "express";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ensureAppDatabase, freePort, runningPid, startMariaDb, stopMariaDb } from "../../scripts/lib/mariadb.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const dir = mkdtempSync(path.join(tmpdir(), "dewline-faults-db-"));
const db = { name: "dewline_faults", user: "dewline_faults", password: "faults-only" };
let port: number;
let t: TestApp;
let tenant: Client;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let stoppedPid: number | null = null;
// One listening server for the whole file: a fresh one per request (supertest's default) churns
// ports fast enough, with 503s answered at once, for a kept-alive client socket to meet a reused port.
let server: Server;
// Only a guard against a hang failing the run forever; the outcome asserted is the status.
const HANG_GUARD = { response: 15_000, deadline: 20_000 };

const report = (marker: string) => ({
  description: `Mould above the window (${marker}).`,
  locations: ["window"],
  observations: ["mould-spots"],
});

beforeAll(async () => {
  port = await freePort();
  await startMariaDb({ dir, port });
  await ensureAppDatabase({ dir, port }, db);
  const ds = createDataSource({ host: "127.0.0.1", port, ...db });
  await ds.initialize();
  await ds.runMigrations();
  await ds.destroy();
  // Every request here reaches the database: no session is answered from the session cache
  // (tests/server/session-cache.test.ts covers that), so each one shows the outage.
  t = await createTestApp({
    DB_PORT: String(port),
    DB_NAME: db.name,
    DB_USER: db.user,
    DB_PASSWORD: db.password,
    SESSION_CACHE_MS: "0",
  });
  server = await new Promise<Server>((resolve) => {
    const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
  });
  server.keepAliveTimeout = 60_000;
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(server as unknown as Express, landlord.tenant.email, PASSWORD);
}, 120_000);

afterAll(async () => {
  if (stoppedPid) process.kill(stoppedPid, "SIGCONT");
  server?.closeAllConnections();
  await new Promise((r) => server?.close(r) ?? r(undefined));
  await t?.close();
  await stopMariaDb(dir);
  rmSync(dir, { recursive: true, force: true });
});

const expectUnavailable = (res: request.Response) => {
  expect(res.status, JSON.stringify(res.body)).toBe(503);
  expect(Number(res.headers["retry-after"])).toBeGreaterThan(0);
  expect(res.body.error.code).toBe("service_unavailable");
};

/** Polls until the signed-in tenant is answered 200 again (a state, not a time), with a bound on tries. */
async function waitForRecovery() {
  for (let i = 0; i < 200; i++) {
    const res = await tenant.get("/api/auth/me").timeout(HANG_GUARD);
    if (res.status === 200) return;
    expect(res.status).toBe(503);
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error("the app did not recover");
}

async function duringOutage() {
  const responses = await Promise.all([
    tenant.get("/api/auth/me").timeout(HANG_GUARD),
    tenant.get("/api/me/cases").timeout(HANG_GUARD),
    tenant.post("/api/cases", report("during the outage")).timeout(HANG_GUARD),
  ]);
  for (const res of responses) expectUnavailable(res);
  // A browser without a session yet: a token whose session cannot be stored would only make its next write a 403.
  expectUnavailable(await request(server).get("/api/auth/csrf").timeout(HANG_GUARD));
  // The calculator needs no database.
  await request(server)
    .post("/api/psychrometrics/evaluate")
    .send({ airTemperatureC: 20, relativeHumidityPct: 60 })
    .timeout(HANG_GUARD)
    .expect(200);
  const ready = await request(server).get("/api/health/ready").timeout(HANG_GUARD).expect(503);
  expect(ready.body).toMatchObject({ status: "unready", reason: "database_down" });
}

describe("the database goes away", () => {
  it("a stalled database (SIGSTOP) gives 503 with Retry-After, not a hang, and the app recovers after SIGCONT", async () => {
    await tenant.post("/api/cases", report("before the stall")).expect(201);
    stoppedPid = runningPid(dir);
    expect(stoppedPid).not.toBeNull();
    process.kill(stoppedPid!, "SIGSTOP");
    try {
      await duringOutage();
      // A second round while it is known to be down.
      await duringOutage();
    } finally {
      process.kill(stoppedPid!, "SIGCONT");
      stoppedPid = null;
    }
    await waitForRecovery();
    await tenant.post("/api/cases", report("after the stall")).expect(201);
  }, 120_000);

  it("a stopped database gives 503 with Retry-After, and the app recovers when it is started again", async () => {
    await stopMariaDb(dir);
    try {
      await duringOutage();
    } finally {
      await startMariaDb({ dir, port });
    }
    await waitForRecovery();
    await tenant.post("/api/cases", report("after the restart")).expect(201);
    // A new browser's token works again: its session was stored before the token was handed out.
    const anon = request.agent(server);
    const { csrfToken } = (await anon.get("/api/auth/csrf").timeout(HANG_GUARD).expect(200)).body;
    await anon
      .post("/api/auth/password-reset")
      .set("X-CSRF-Token", csrfToken)
      .send({ email: landlord.tenant.email })
      .timeout(HANG_GUARD)
      .expect(202);
  }, 120_000);

  it("no write is answered 500, and every committed report was answered 201, across a restart", async () => {
    const statusOf = new Map<string, number>();
    const write = async (marker: string) => {
      const res = await tenant.post("/api/cases", report(marker)).timeout(HANG_GUARD);
      statusOf.set(marker, res.status);
      // A client told to come back later does not hammer the server meanwhile.
      if (res.status === 503) await new Promise((r) => setTimeout(r, 50));
    };
    let n = 0;
    const writer = async (stop: { done: boolean }) => {
      while (!stop.done) await write(`write ${n++}`);
    };
    const stop = { done: false };
    const writers = [writer(stop), writer(stop), writer(stop)];
    // Wait for writes to be flowing (a state), then stop the database under them.
    while (n < 6) await new Promise((r) => setTimeout(r, 20));
    await stopMariaDb(dir);
    const atStop = n;
    while (n < atStop + 6) await new Promise((r) => setTimeout(r, 20));
    await startMariaDb({ dir, port });
    await waitForRecovery();
    const atStart = n;
    while (n < atStart + 6) await new Promise((r) => setTimeout(r, 20));
    stop.done = true;
    await Promise.all(writers);

    const statuses = [...statusOf.values()];
    expect(statuses.filter((s) => s !== 201 && s !== 503)).toEqual([]);
    expect(statuses).toContain(503);
    const rows = await t.ctx.dataSource.getRepository(Case).findBy({ tenantUserId: landlord.tenant.id });
    const committed = rows.map((r) => /\((write \d+)\)/.exec(r.description)?.[1]).filter((m): m is string => !!m);
    // Every committed write was acknowledged, and nothing acknowledged is missing.
    expect(committed.filter((m) => statusOf.get(m) !== 201)).toEqual([]);
    expect([...statusOf].filter(([, s]) => s === 201).length).toBe(committed.length);
  }, 180_000);
});
