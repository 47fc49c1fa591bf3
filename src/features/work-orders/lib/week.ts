// Calendar dates (YYYY-MM-DD, London) for the week board: today, the Monday of a week, and the days
// Monday to Friday. Dates are handled as UTC midnights so no time zone can shift them a day.

import { formatCalendarLong, formatCalendarShort, isIsoDate, todayInLondon } from "@/lib/dates";

export { isIsoDate, todayInLondon };

const DAY_MS = 86_400_000;

const toUtc = (date: string) => Date.parse(`${date}T00:00:00Z`);
const fromUtc = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export const addDays = (date: string, days: number) => fromUtc(toUtc(date) + days * DAY_MS);

/** The Monday of the week a date falls in. */
export function mondayOf(date: string): string {
  const weekday = new Date(toUtc(date)).getUTCDay(); // 0 Sunday … 6 Saturday
  return addDays(date, -((weekday + 6) % 7));
}

/** Monday to Friday of the week starting on `monday`. */
export const workingDays = (monday: string): string[] => [0, 1, 2, 3, 4].map((i) => addDays(monday, i));

/** "Monday 7 December" */
export const formatWeekday = (date: string) => formatCalendarLong(date, false);
/** "Monday 7 December 2026" */
export const formatLongDate = (date: string) => formatCalendarLong(date);
/** "7 Dec 2026" */
export const formatShortDate = formatCalendarShort;
