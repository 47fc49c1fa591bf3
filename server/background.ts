// The server's background work, started by whichever entry serves the app (server.ts, npm start),
// never by createApp, so tests' apps run no timers.
import type { AppContext } from "./app-context.js";
import { startDigestScheduler } from "./modules/digest/digest.scheduler.js";
import { startTriageSweeper } from "./modules/triage/triage.sweeper.js";

/** Starts the triage sweep and the deadline digest; returns a function that stops both. */
export function startBackgroundJobs(ctx: Pick<AppContext, "services" | "logger">): () => void {
  const stopTriageSweeper = startTriageSweeper(ctx.services.triage, ctx.logger);
  const digestScheduler = startDigestScheduler(ctx.services, ctx.logger);
  return () => {
    stopTriageSweeper();
    digestScheduler.stop();
  };
}
