// One way to run a background job on a timer: never two runs at a time (a tick during a slow run is
// skipped), a failure logged and the next tick tried as usual, the timer unref'd so it never keeps the
// process alive. With leases (job-lease.ts) the job runs on one app instance at a time: each tick
// first takes the job's lease in the database, renews it while the run lasts and gives it back after.
// Every timed job in server/modules and server/background.ts starts through `leasedJob`.
import type { JobLeases } from "./job-lease.js";
import type { Logger } from "./logger.js";

/** What a job's start function takes (background.ts hands in the leases; tests often a short interval). */
export interface LeasedJobOptions {
  everyMs?: number;
  /**
   * Runs on one instance at a time, under the job's row in `job_leases`. Without them the job runs
   * in every process that starts it (tests, scripts).
   */
  leases?: JobLeases;
}

export interface LeasedJob {
  /** The work of one run. */
  run: () => Promise<unknown>;
  everyMs: number;
  logger: Logger;
  /** What the log says when a run fails. */
  failure: string;
  /** Try once at start too (what the last process left undone); with a lease, only if the job is due. */
  atStart?: boolean;
  /** The first try after this long instead of after `everyMs` (ignored with `atStart`). */
  firstAfterMs?: number;
  /** See LeasedJobOptions.leases. */
  leases?: JobLeases;
}

export interface RepeatingJobHandle {
  /** One tick now, as the timer does it; resolves when it is over (never rejects). */
  tick(): Promise<void>;
  /** Stops the timer; resolves once a run in progress has finished. */
  stop(): Promise<void>;
}

/**
 * Starts the job named `name` (its row in `job_leases`, and its name in the failure log when leased);
 * `stop()` on the handle resolves once a run in progress has finished.
 */
export function leasedJob(
  name: string,
  { run, everyMs, logger, failure, atStart = false, firstAfterMs, leases }: LeasedJob,
): RepeatingJobHandle {
  const lease = leases ? { leases, name } : undefined;
  let running: Promise<void> | null = null;
  let stopped = false;

  const once = async () => {
    if (!lease) {
      await run();
      return;
    }
    const held = await lease.leases.take(lease.name, { everyMs });
    if (!held || stopped) {
      await held?.release();
      return;
    }
    // Renewed three times per lease length, so one slow or failed renewal does not lose it.
    const renewal = setInterval(() => void held.renew(), Math.max(10, Math.floor(lease.leases.leaseMs / 3)));
    renewal.unref();
    try {
      await run();
      clearInterval(renewal);
      await held.release();
    } catch (error) {
      clearInterval(renewal);
      await held.release(error);
      throw error;
    }
  };

  const tick = (): Promise<void> => {
    if (stopped) return Promise.resolve();
    running ??= once()
      .catch((error: unknown) =>
        logger.error({ err: error, ...(lease ? { job: lease.name, holder: lease.leases.holder } : {}) }, failure),
      )
      .finally(() => {
        running = null;
      });
    return running;
  };

  const first = atStart ? null : firstAfterMs === undefined ? null : setTimeout(() => void tick(), firstAfterMs);
  first?.unref();
  if (atStart) void tick();
  const timer = setInterval(() => void tick(), everyMs);
  timer.unref();
  return {
    tick,
    async stop() {
      stopped = true;
      if (first) clearTimeout(first);
      clearInterval(timer);
      await running;
    },
  };
}
