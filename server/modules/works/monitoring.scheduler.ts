import type { Logger } from "../../lib/logger.js";
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
  let running: Promise<void> | null = null;
  const timer = setInterval(() => {
    if (running) return;
    running = verification
      .sendDueReminders()
      .then(() => undefined)
      .catch((error: unknown) => logger.error({ err: error }, "monitoring reminders failed"))
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
