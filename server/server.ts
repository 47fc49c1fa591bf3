// Production entry (`node dist-server/server/server.js`): read config → connect → listen → background
// jobs. Migrations are a separate step (`npm run db:migrate`); until they have run, /api/health/ready
// says so. On SIGTERM/SIGINT it drains: readiness fails at once, then (after SHUTDOWN_DELAY_MS) it stops
// accepting, lets requests in flight and a running background job finish (at most
// SHUTDOWN_TIMEOUT_MS), closes the database and exits 0.
import type { ServerResponse } from "node:http";
import { setTimeout as sleep } from "node:timers/promises";
import { loadConfig } from "./config/env.js";
import { createApp } from "./app.js";
import { createAppContext } from "./app-context.js";
import { startBackgroundJobs } from "./background.js";

const config = loadConfig();
const ctx = await createAppContext(config);
let draining = false;
const app = createApp(ctx, { isDraining: () => draining });
const stopBackgroundJobs = startBackgroundJobs(ctx);
const server = app.listen(config.port, config.host, () => {
  ctx.logger.info(`Dewline listening on http://${config.host}:${config.port}`);
});
server.once("error", (error) => {
  ctx.logger.fatal({ err: error }, "the server could not listen");
  process.exit(1);
});

// Responses not yet sent when draining starts are told to close their connection too, so no
// keep-alive connection outlives the drain.
const inFlight = new Set<ServerResponse>();
server.on("request", (_req, res: ServerResponse) => {
  inFlight.add(res);
  res.once("close", () => inFlight.delete(res));
});

/** Resolves true when `work` finishes before `deadline` (a time from performance.now()), false otherwise. */
async function before(deadline: number, work: Promise<unknown>): Promise<boolean> {
  const timeout = new AbortController();
  const timedOut = sleep(Math.max(0, deadline - performance.now()), false, { signal: timeout.signal }).catch(() => false);
  try {
    return await Promise.race([work.then(() => true), timedOut]);
  } finally {
    timeout.abort();
  }
}

async function shutdown(signal: string) {
  if (draining) return;
  draining = true;
  ctx.logger.info({ signal }, "shutting down: readiness fails from now; finishing requests and jobs");
  const jobsDone = stopBackgroundJobs();
  if (config.shutdown.delayMs > 0) await sleep(config.shutdown.delayMs);

  const deadline = performance.now() + config.shutdown.timeoutMs;
  const closed = new Promise<void>((resolve) => server.close(() => resolve()));
  for (const res of inFlight) if (!res.headersSent) res.setHeader("Connection", "close");
  server.closeIdleConnections();
  if (!(await before(deadline, closed))) {
    ctx.logger.warn({ open: inFlight.size }, "requests still running at the shutdown timeout; closing their connections");
    server.closeAllConnections();
  }
  if (!(await before(deadline, jobsDone))) ctx.logger.warn("a background job was still running at the shutdown timeout");
  await ctx.close();
  ctx.logger.info("stopped");
  process.exit(0);
}

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    shutdown(signal).catch((error: unknown) => {
      ctx.logger.fatal({ err: error }, "shutdown failed");
      process.exit(1);
    });
  });
}
