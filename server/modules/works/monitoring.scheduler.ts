import type { Logger } from "../../lib/logger.js";
import type { VerificationService } from "./verification.service.js";

const EVERY_MS = 10 * 60_000;

/** Every 10 minutes: the reminders for monitoring periods that have ended. Returns a stop function. */
export function startMonitoringReminders(verification: VerificationService, logger: Logger): () => void {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    verification
      .sendDueReminders()
      .catch((error: unknown) => logger.error({ err: error }, "monitoring reminders failed"))
      .finally(() => {
        running = false;
      });
  }, EVERY_MS);
  timer.unref();
  return () => clearInterval(timer);
}
