import type { Logger } from "../../lib/logger.js";
import type { SensorWatchService } from "./sensor-watch.service.js";

const SWEEP_EVERY_MS = 60_000;

/**
 * Finds rooms whose figures are behind their sensors' latest readings (an evaluation lost to a
 * crash or a restart) and queues them. Returns a stop function that waits for the queue to drain.
 */
export function startSensorWatchSweep(
  watch: Pick<SensorWatchService, "sweep" | "drain">,
  logger: Logger,
  { everyMs = SWEEP_EVERY_MS }: { everyMs?: number } = {},
): () => Promise<void> {
  let running: Promise<void> | null = null;
  const run = () => {
    if (running) return;
    running = watch
      .sweep()
      .then((n) => {
        if (n) logger.debug({ rooms: n }, "sensor rooms queued by the sweep");
      })
      .catch((error: unknown) => logger.error({ err: error }, "sensor watch sweep failed"))
      .finally(() => {
        running = null;
      });
  };
  // At start-up too: what the last process left undone.
  run();
  const timer = setInterval(run, everyMs);
  timer.unref();
  return async () => {
    clearInterval(timer);
    await running;
    await watch.drain();
  };
}
