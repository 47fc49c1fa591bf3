import { Router } from "express";
import { healthResponse } from "../../../src/lib/contracts/health.js";
import { shaped } from "../../lib/contract.js";
import type { DataSource } from "typeorm";

const DB_TIMEOUT_MS = 2000;

async function databaseAnswers(dataSource: DataSource): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), DB_TIMEOUT_MS);
  });
  try {
    return await Promise.race([dataSource.query("SELECT 1").then(() => true), timeout]);
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}

/** `GET /api/health`: mounted before sessions, so it answers even when the session store cannot. */
export function createHealthRouter({ dataSource }: { dataSource: DataSource }): Router {
  const router = Router();
  router.get("/", async (_req, res) => {
    const up = await databaseAnswers(dataSource);
    res.status(up ? 200 : 503).json(shaped(healthResponse, { status: up ? "ok" : "degraded", db: up ? "up" : "down" }));
  });
  return router;
}
