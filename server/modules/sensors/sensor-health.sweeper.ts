import type { Logger } from "../../lib/logger.js";
import { startRepeatingJob } from "../../lib/repeating-job.js";
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
  return startRepeatingJob({
    everyMs,
    logger,
    failure: "sensor health sweep failed",
    run: async () => {
      const checked = await sensorHealth.sweep();
      if (checked.length) logger.debug({ checked: checked.length }, "sensor health checked");
    },
  });
}
