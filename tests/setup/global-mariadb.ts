// A throwaway MariaDB for one test run: temporary data directory, free port, migrated schema.
// Torn down at the end whether the tests passed or not.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { createDataSource } from "../../server/db/create-data-source.js";
import { ensureAppDatabase, freePort, startMariaDb, stopMariaDb } from "../../scripts/lib/mariadb.js";

export interface TestDb {
  dir: string;
  host: string;
  port: number;
  name: string;
  user: string;
  password: string;
}

declare module "vitest" {
  export interface ProvidedContext {
    testDb: TestDb;
  }
}

export default async function setup(project: TestProject) {
  const dir = mkdtempSync(path.join(tmpdir(), "dewline-test-db-"));
  const port = await freePort();
  const db: TestDb = { dir, host: "127.0.0.1", port, name: "dewline_test", user: "dewline_test", password: "test-only-password" };
  const teardown = async () => {
    await stopMariaDb(dir).catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  };
  try {
    await startMariaDb({ dir, port });
    await ensureAppDatabase({ dir, port }, db);
    const ds = createDataSource(db);
    await ds.initialize();
    await ds.runMigrations({ transaction: "each" });
    await ds.destroy();
  } catch (error) {
    await teardown();
    throw error;
  }
  project.provide("testDb", db);
  return teardown;
}
