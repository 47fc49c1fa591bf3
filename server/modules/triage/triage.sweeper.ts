import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { TriageService } from "./triage.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "triage-sweep";

const SWEEP_EVERY_MS = 30_000;

/**
 * Works out stale triage figures in the background (cases changed while nobody looked at the queue,
 * or whose deadline factor has moved with the clock), so e-mail digests and reports read true figures.
 * Returns a stop function, which resolves once a sweep in progress has finished.
 */
export function startTriageSweeper(
  triage: Pick<TriageService, "refreshStale">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "triage sweep failed",
    run: async () => {
      const n = await triage.refreshStale(undefined, 500);
      if (n) logger.debug({ refreshed: n }, "triage figures refreshed");
    },
  }).stop;
}
