import type { Logger } from "../../lib/logger.js";
import { startRepeatingJob } from "../../lib/repeating-job.js";
import type { VerificationService } from "./verification.service.js";

const EVERY_MS = 10 * 60_000;

/**
 * Every 10 minutes: the reminders for monitoring periods that have ended. Returns a stop function,
 * which resolves once a run in progress has finished.
 */
export function startMonitoringReminders(
  verification: Pick<VerificationService, "sendDueReminders">,
  logger: Logger,
  { everyMs = EVERY_MS }: { everyMs?: number } = {},
): () => Promise<void> {
  return startRepeatingJob({
    everyMs,
    logger,
    failure: "monitoring reminders failed",
    run: () => verification.sendDueReminders(),
  });
}
