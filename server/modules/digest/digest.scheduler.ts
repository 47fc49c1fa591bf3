// Sends the officers' deadline digest each working morning. Checks every 10 minutes (and once
// shortly after start, so a restart after 07:00 does not wait); from 07:00 London time it brings
// stale triage figures (the cases' next deadlines) up to date and asks DigestService for today's
// digests, which sends each officer's at most once a day. After a run with no failures the day is
// done here; a failed run is tried again at the next check. Errors are logged, never thrown: the
// server keeps running. With job leases (background.ts) the checks run on one instance at a time.
// Started by the server entry, never by createApp, so tests' apps start no timers.
import { localDate, LONDON_TIME_ZONE } from "../../../src/lib/domain/working-days.js";
import { systemClock } from "../../lib/clock.js";
import type { JobLeases } from "../../lib/job-lease.js";
import type { Logger } from "../../lib/logger.js";
import { leasedJob } from "../../lib/repeating-job.js";
import type { TriageService } from "../triage/triage.service.js";
import type { DigestRun, DigestService } from "./digest.service.js";

/** The London hour from which the day's digest goes out. */
export const DIGEST_HOUR = 7;
const CHECK_EVERY_MS = 10 * 60_000;
const FIRST_CHECK_MS = 30_000;
const REFRESH_BATCH = 500;
const MAX_REFRESH_BATCHES = 40;

/** What the digest needs of the app's services (`ctx.services` will do). */
export interface DigestServices {
  digest: Pick<DigestService, "sendDue">;
  triage: Pick<TriageService, "refreshStale">;
}

/**
 * Today's digests with true figures: cases whose next deadline is stale (changed, or moved by the
 * clock) are worked out first, in batches, as the triage sweeper would. Used by the scheduler and
 * by `npm run digest`.
 */
export async function sendDigestsNow(services: DigestServices, now: Date): Promise<DigestRun> {
  for (let batch = 0; batch < MAX_REFRESH_BATCHES; batch += 1) {
    if ((await services.triage.refreshStale(undefined, REFRESH_BATCH)) < REFRESH_BATCH) break;
  }
  return services.digest.sendDue(now);
}

export interface DigestScheduler {
  /** One check now, as the timer does it (resolves when the check is over; never rejects). */
  check(): Promise<void>;
  /** Stops the timers; resolves once a run in progress has finished. */
  stop(): Promise<void>;
}

const hourFormat = new Intl.DateTimeFormat("en-GB", { timeZone: LONDON_TIME_ZONE, hour: "numeric", hourCycle: "h23" });

/** The hour of the day (0–23) in London at `instant`. */
export function londonHour(instant: Date): number {
  return Number(hourFormat.formatToParts(instant).find((p) => p.type === "hour")?.value ?? 0);
}

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "deadline-digest";

export function startDigestScheduler(
  services: DigestServices,
  logger: Logger,
  options: { clock?: () => Date; intervalMs?: number; firstCheckMs?: number; leases?: JobLeases } = {},
): DigestScheduler {
  // Whoever starts the scheduler hands in the AppContext's clock (see background.ts).
  const clock = options.clock ?? (() => systemClock.now());
  // The day this instance has sent every digest for. Another instance that takes the job over sends
  // that day's again, which DigestService turns into "already sent".
  let doneFor: string | null = null;

  const run = async () => {
    const now = clock();
    const date = localDate(now);
    if (doneFor === date || londonHour(now) < DIGEST_HOUR) return;
    const result = await sendDigestsNow(services, now);
    if (result.failed === 0) doneFor = date;
    if (result.sent || result.failed) logger.info({ digest: result }, "deadline digests sent");
  };

  const job = leasedJob(JOB_NAME, {
    run,
    everyMs: options.intervalMs ?? CHECK_EVERY_MS,
    firstAfterMs: options.firstCheckMs ?? FIRST_CHECK_MS,
    logger,
    failure: "deadline digests failed; trying again at the next check",
    leases: options.leases,
  });
  return { check: job.tick, stop: job.stop };
}
