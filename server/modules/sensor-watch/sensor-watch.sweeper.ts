import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { SensorWatchService } from "./sensor-watch.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "sensor-watch-sweep";

const SWEEP_EVERY_MS = 60_000;

/**
 * Finds rooms whose figures are behind their sensors' latest readings (an evaluation lost to a
 * crash or a restart) and queues them. Returns a stop function that waits for the queue to drain.
 */
export function startSensorWatchSweep(
  watch: Pick<SensorWatchService, "sweep" | "drain">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  const stop = leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "sensor watch sweep failed",
    // At start-up too: what the last process left undone.
    atStart: true,
    run: async () => {
      const n = await watch.sweep();
      if (n) logger.debug({ rooms: n }, "sensor rooms queued by the sweep");
    },
  }).stop;
  return async () => {
    await stop();
    await watch.drain();
  };
}
