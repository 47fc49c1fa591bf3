// The tests' one "now": TEST_NOW (an ISO instant) when set, else the real time when the file started,
// plus the real time elapsed since, so time still moves forward in order (a row written later is
// later). createTestApp() hands it to the server; tests do their date arithmetic with it, never
// with Date.now(). `npm run test:dates` runs the date-sensitive suites at chosen TEST_NOW dates.
import { performance } from "node:perf_hooks";
import type { Clock } from "../../server/lib/clock.js";
import { addCalendarDays, isWorkingDay, localDate } from "../../src/lib/domain/working-days.js";

const DAY_MS = 86_400_000;

function startInstant(): number {
  const text = process.env.TEST_NOW;
  if (!text) return Date.now();
  const ms = Date.parse(text);
  if (Number.isNaN(ms)) throw new Error(`TEST_NOW is not an ISO date and time: ${text}`);
  return ms;
}

const startMs = startInstant();
const startedAt = performance.now();

export const testClock: Clock = {
  now: () => new Date(startMs + Math.round(performance.now() - startedAt)),
};

/** The test clock's now, less `ms`. */
export const msAgo = (ms: number): Date => new Date(testClock.now().getTime() - ms);
export const hoursAgo = (h: number): Date => msAgo(h * 3_600_000);
export const daysAgo = (d: number): Date => msAgo(d * DAY_MS);
export const daysAhead = (d: number): Date => msAgo(-d * DAY_MS);

/**
 * The next `count` distinct London working days (no weekend, no England-and-Wales bank holiday)
 * at least `minDays` calendar days after today, as YYYY-MM-DD, in order.
 */
export function workingDaysAhead(minDays: number, count = 1): string[] {
  const out: string[] = [];
  let day = addCalendarDays(testClock.now(), minDays);
  while (out.length < count) {
    const date = localDate(day);
    if (isWorkingDay(date) && !out.includes(date)) out.push(date);
    day = addCalendarDays(day, 1);
  }
  return out;
}

/** The first London working day at least `minDays` calendar days after today. */
export const workingDayAhead = (minDays: number): string => workingDaysAhead(minDays, 1)[0]!;
