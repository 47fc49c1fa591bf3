// /api/health (and /ready, /live) against a MariaDB of this file's own, which the test stops and starts again.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, expect, it } from "vitest";
import { ensureAppDatabase, freePort, startMariaDb, stopMariaDb } from "../../scripts/lib/mariadb.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { createTestApp, type TestApp } from "../support/test-app.js";

const dir = mkdtempSync(path.join(tmpdir(), "dewline-health-db-"));
let port: number;
let t: TestApp;
const db = { name: "dewline_health", user: "dewline_health", password: "health-only" };

beforeAll(async () => {
  port = await freePort();
  await startMariaDb({ dir, port });
  await ensureAppDatabase({ dir, port }, db);
  const ds = createDataSource({ host: "127.0.0.1", port, ...db });
  await ds.initialize();
  await ds.runMigrations();
  await ds.destroy();
  t = await createTestApp({ DB_PORT: String(port), DB_NAME: db.name, DB_USER: db.user, DB_PASSWORD: db.password });
});

afterAll(async () => {
  await t?.close();
  await stopMariaDb(dir);
  rmSync(dir, { recursive: true, force: true });
});

it("reports the database up, then 503 while MariaDB is stopped, then recovers by itself", async () => {
  const up = await request(t.app).get("/api/health").expect(200);
  expect(up.body).toEqual({ status: "ok", db: "up" });

  await stopMariaDb(dir);
  const down = await request(t.app).get("/api/health").expect(503);
  expect(down.body.db).toBe("down");
  // Readiness fails with its reason; liveness does not (the process is fine, restarting it would not help).
  const unready = await request(t.app).get("/api/health/ready").expect(503);
  expect(unready.body).toMatchObject({ status: "unready", reason: "database_down" });
  await request(t.app).get("/api/health/live").expect(200);

  await startMariaDb({ dir, port });
  let last = 0;
  for (let i = 0; i < 50 && last !== 200; i++) {
    last = (await request(t.app).get("/api/health")).status;
    if (last !== 200) await new Promise((r) => setTimeout(r, 200));
  }
  expect(last).toBe(200);
  await request(t.app).get("/api/health/ready").expect(200, { status: "ready" });
});
