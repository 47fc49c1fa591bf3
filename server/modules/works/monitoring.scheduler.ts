import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { VerificationService } from "./verification.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "monitoring-reminders";

const EVERY_MS = 10 * 60_000;

/**
 * Every 10 minutes: the reminders for monitoring periods that have ended. Returns a stop function,
 * which resolves once a run in progress has finished.
 */
export function startMonitoringReminders(
  verification: Pick<VerificationService, "sendDueReminders">,
  logger: Logger,
  { everyMs = EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "monitoring reminders failed",
    run: () => verification.sendDueReminders(),
  }).stop;
}
