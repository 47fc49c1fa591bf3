// The throwaway database every benchmark runs on: MariaDB started in a temporary folder, the app's
// database and user made, the schema migrated; `stop()` closes, stops and removes it all.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { DataSource } from "typeorm";
import { createDataSource } from "../../server/db/create-data-source.js";
import { ensureAppDatabase, freePort, startMariaDb, stopMariaDb, type AppDatabase } from "./mariadb.js";

export interface BenchDatabase {
  /** The temporary folder: MariaDB's files in `mariadb/`, the rest free for the benchmark's own files. */
  dir: string;
  db: AppDatabase & { host: string; port: number };
  /** Connected and migrated; a benchmark may destroy it early (stop() then leaves it be). */
  ds: DataSource;
  stop(): Promise<void>;
}

/** Starts a benchmark's database in a folder named after it (`dewline-bench-<name>-…`). */
export async function startBenchDatabase(name: string): Promise<BenchDatabase> {
  const dir = mkdtempSync(path.join(tmpdir(), `dewline-bench-${name}-`));
  const instance = { dir: path.join(dir, "mariadb"), port: await freePort() };
  const db = { host: "127.0.0.1", port: instance.port, name: "dewline_bench", user: "dewline_bench", password: "bench-only" };
  let ds: DataSource | undefined;
  const stop = async () => {
    if (ds?.isInitialized) await ds.destroy().catch(() => undefined);
    await stopMariaDb(instance.dir).catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  };
  try {
    await startMariaDb(instance);
    await ensureAppDatabase(instance, db);
    ds = createDataSource(db);
    await ds.initialize();
    await ds.runMigrations({ transaction: "each" });
    return { dir, db, ds, stop };
  } catch (error) {
    await stop();
    throw error;
  }
}
