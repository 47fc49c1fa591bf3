import type { Logger } from "../../lib/logger.js";
import { startRepeatingJob } from "../../lib/repeating-job.js";
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
  return startRepeatingJob({
    everyMs,
    logger,
    failure: "triage sweep failed",
    run: async () => {
      const n = await triage.refreshStale(undefined, 500);
      if (n) logger.debug({ refreshed: n }, "triage figures refreshed");
    },
  });
}
