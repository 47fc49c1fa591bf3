import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { SensorHealthService } from "./sensor-health.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "sensor-health-sweep";

const SWEEP_EVERY_MS = 60_000;

/**
 * Keeps each sensor's stored health check current: every minute, checks the sensors with readings newer
 * than their last check (and re-checks stored problems hourly). Returns a stop function, which resolves
 * once a sweep in progress has finished.
 */
export function startSensorHealthSweeper(
  sensorHealth: Pick<SensorHealthService, "sweep">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "sensor health sweep failed",
    run: async () => {
      const checked = await sensorHealth.sweep();
      if (checked.length) logger.debug({ checked: checked.length }, "sensor health checked");
    },
  }).stop;
}
