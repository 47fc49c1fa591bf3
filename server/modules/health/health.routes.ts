import { Router } from "express";
import { healthResponse, livenessResponse, readinessResponse } from "../../../src/lib/contracts/health.js";
import { shaped } from "../../lib/contract.js";
import type { DataSource } from "typeorm";
import { pendingMigrations } from "../../db/migrate.js";
import { databaseWatchOf } from "../../lib/database-watch.js";

const DB_TIMEOUT_MS = 2000;

/** The promise's value, or `fallback` when it fails or takes longer than DB_TIMEOUT_MS. */
async function withinTimeout<T>(work: Promise<T>, fallback: T): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<T>((resolve) => {
    timer = setTimeout(() => resolve(fallback), DB_TIMEOUT_MS);
  });
  try {
    return await Promise.race([work, timeout]);
  } catch {
    return fallback;
  } finally {
    clearTimeout(timer);
  }
}

const databaseAnswers = async (dataSource: DataSource) =>
  !databaseWatchOf(dataSource)?.isDown &&
  withinTimeout(
    dataSource.query("SELECT 1").then(() => true),
    false,
  );

export type Readiness =
  | { ready: true }
  | { ready: false; reason: "shutting_down" | "database_down" | "migrations_pending"; message: string; pending?: string[] };

/** Whether this process should be sent traffic: not shutting down, the database answers, no migration pending. */
export async function checkReadiness(dataSource: DataSource, isDraining: () => boolean): Promise<Readiness> {
  if (isDraining())
    return { ready: false, reason: "shutting_down", message: "The server is shutting down and finishing its requests." };
  // Known down (server/lib/database-watch.ts): say so at once, without waiting on it.
  const pending = databaseWatchOf(dataSource)?.isDown ? null : await withinTimeout(pendingMigrations(dataSource), null);
  if (pending === null) return { ready: false, reason: "database_down", message: "The database does not answer." };
  if (pending.length > 0) {
    return {
      ready: false,
      reason: "migrations_pending",
      message: `${pending.length} migration(s) have not run: run npm run db:migrate.`,
      pending,
    };
  }
  return { ready: true };
}

export interface HealthDeps {
  dataSource: DataSource;
  /** True from the moment the server starts shutting down. */
  isDraining?: () => boolean;
}

/**
 * Mounted before sessions, so it answers even when the session store cannot.
 * - `GET /api/health`: the database answers (the original check, kept for monitors that use it).
 * - `GET /api/health/live`: the process is up and serving (restart it when this fails).
 * - `GET /api/health/ready`: send traffic here (the database answers, migrations are current, not shutting down).
 */
export function createHealthRouter({ dataSource, isDraining = () => false }: HealthDeps): Router {
  const router = Router();
  router.use((_req, res, next) => {
    res.set("Cache-Control", "no-store");
    next();
  });
  router.get("/", async (_req, res) => {
    const up = await databaseAnswers(dataSource);
    res.status(up ? 200 : 503).json(shaped(healthResponse, { status: up ? "ok" : "degraded", db: up ? "up" : "down" }));
  });
  router.get("/live", (_req, res) => {
    res.json(shaped(livenessResponse, { status: "live" }));
  });
  router.get("/ready", async (_req, res) => {
    const readiness = await checkReadiness(dataSource, isDraining);
    if (readiness.ready) {
      res.json(shaped(readinessResponse, { status: "ready" }));
      return;
    }
    const { ready: _ready, ...why } = readiness;
    res.status(503).json(shaped(readinessResponse, { status: "unready", ...why }));
  });
  return router;
}
