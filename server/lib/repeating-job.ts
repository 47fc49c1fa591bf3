// One way to run a background job on a timer: never two runs at a time (a tick during a slow run is
// skipped), a failure logged and the next tick tried as usual, the timer unref'd so it never keeps the
// process alive.
import type { Logger } from "./logger.js";

export interface RepeatingJob {
  /** The work of one run. */
  run: () => Promise<unknown>;
  everyMs: number;
  logger: Logger;
  /** What the log says when a run fails. */
  failure: string;
  /** Run once at start too (what the last process left undone). */
  atStart?: boolean;
}

/** Starts the job; the stop function resolves once a run in progress has finished. */
export function startRepeatingJob({ run, everyMs, logger, failure, atStart = false }: RepeatingJob): () => Promise<void> {
  let running: Promise<void> | null = null;
  const tick = () => {
    if (running) return;
    running = run()
      .then(() => undefined)
      .catch((error: unknown) => logger.error({ err: error }, failure))
      .finally(() => {
        running = null;
      });
  };
  if (atStart) tick();
  const timer = setInterval(tick, everyMs);
  timer.unref();
  return async () => {
    clearInterval(timer);
    await running;
  };
}
