import type { Logger } from "../../lib/logger.js";
import type { SensorHealthService } from "./sensor-health.service.js";

const SWEEP_EVERY_MS = 60_000;

/**
 * Keeps each sensor's stored health check current: every minute, checks the sensors with readings newer
 * than their last check (and re-checks stored problems hourly). Returns a stop function, which resolves
 * once a sweep in progress has finished.
 */
export function startSensorHealthSweeper(
  sensorHealth: Pick<SensorHealthService, "sweep">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS }: { everyMs?: number } = {},
): () => Promise<void> {
  let running: Promise<void> | null = null;
  const timer = setInterval(() => {
    if (running) return;
    running = sensorHealth
      .sweep()
      .then((checked) => {
        if (checked.length) logger.debug({ checked: checked.length }, "sensor health checked");
      })
      .catch((error: unknown) => logger.error({ err: error }, "sensor health sweep failed"))
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
