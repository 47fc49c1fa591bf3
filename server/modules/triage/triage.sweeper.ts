import type { Logger } from "../../lib/logger.js";
import type { TriageService } from "./triage.service.js";

const SWEEP_EVERY_MS = 30_000;

/**
 * Works out stale triage figures in the background (cases changed while nobody looked at the queue,
 * or whose deadline factor has moved with the clock), so e-mail digests and reports read true figures.
 * Returns a stop function, which resolves once a sweep in progress has finished.
 */
export function startTriageSweeper(
  triage: Pick<TriageService, "refreshStale">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS }: { everyMs?: number } = {},
): () => Promise<void> {
  let running: Promise<void> | null = null;
  const timer = setInterval(() => {
    if (running) return;
    running = triage
      .refreshStale(undefined, 500)
      .then((n) => {
        if (n) logger.debug({ refreshed: n }, "triage figures refreshed");
      })
      .catch((error: unknown) => logger.error({ err: error }, "triage sweep failed"))
      .finally(() => {
        running = null;
      });
  }, everyMs);
  timer.unref();
  return async () => {
    clearInterval(timer);
    await running;
  };
}
