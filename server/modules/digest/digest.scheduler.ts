// Sends the officers' deadline digest each working morning. Checks every 10 minutes (and once
// shortly after start, so a restart after 07:00 does not wait); from 07:00 London time it brings
// stale triage figures (the cases' next deadlines) up to date and asks DigestService for today's
// digests, which sends each officer's at most once a day. After a run with no failures the day is
// done here; a failed run is tried again at the next check. Errors are logged, never thrown: the
// server keeps running. Started by the server entry, never by createApp, so tests' apps start no
// timers.
import { localDate, LONDON_TIME_ZONE } from "../../../src/lib/domain/working-days.js";
import { systemClock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
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

export function startDigestScheduler(
  services: DigestServices,
  logger: Logger,
  options: { clock?: () => Date; intervalMs?: number; firstCheckMs?: number } = {},
): DigestScheduler {
  // Whoever starts the scheduler hands in the AppContext's clock (see background.ts).
  const clock = options.clock ?? (() => systemClock.now());
  let doneFor: string | null = null;
  let running: Promise<void> | null = null;
  let stopped = false;

  const run = async () => {
    const now = clock();
    const date = localDate(now);
    if (doneFor === date || londonHour(now) < DIGEST_HOUR) return;
    try {
      const result = await sendDigestsNow(services, now);
      if (result.failed === 0) doneFor = date;
      if (result.sent || result.failed) logger.info({ digest: result }, "deadline digests sent");
    } catch (error) {
      logger.error(
        { err: error instanceof Error ? error.message : String(error) },
        "deadline digests failed; trying again at the next check",
      );
    }
  };

  const check = (): Promise<void> => {
    if (stopped) return Promise.resolve();
    // One run at a time: a check during a slow run waits for it instead of starting another.
    running ??= run().finally(() => {
      running = null;
    });
    return running;
  };

  const first = setTimeout(() => void check(), options.firstCheckMs ?? FIRST_CHECK_MS);
  first.unref();
  const timer = setInterval(() => void check(), options.intervalMs ?? CHECK_EVERY_MS);
  timer.unref();

  return {
    check,
    async stop() {
      stopped = true;
      clearTimeout(first);
      clearInterval(timer);
      await running;
    },
  };
}
