// Working days for statutory timeframes (TRADE.md §5): weekdays that are not bank holidays in
// England and Wales. This is the only module that imports date-holidays (a data library, no I/O).
//
// Conventions:
// - Bank holidays: the package's "public" holidays for GB-ENG, cached per year. Its data for
//   GB-WLS gives the same dates (checked for 1970–2100 in 3.37.0; a test keeps checking), so one
//   calendar serves England and Wales. Entries that fall on a weekend (Boxing Day on a Saturday)
//   change nothing; the substitute weekday the package lists is what makes the difference. The
//   package only knows one-off holidays once they are announced (it has the 2022 and 2023 ones).
// - Counting (our own choice, the usual reading of "within N working days of X"): the local day
//   of X is day 0 and does not count; the deadline is the end of the Nth working day after it.
//   If X falls on a weekend or bank holiday the next working day is day 1, so awareness on
//   Friday evening, Saturday or Sunday all lead to the same deadline.
// - End of a day (our own choice): 23:59:59.999 local time, returned as a UTC instant. A working
//   day is a calendar day here, not office hours; anything done on the day is in time.
// - Days are calendar days in `timeZone` (default Europe/London); the offsets come from Intl, so
//   GMT/BST changes are handled and the process time zone plays no part. The holidays are England
//   and Wales's whatever the zone.
import Holidays from "date-holidays";
import { ZoneConverter } from "./time-zone.js";

export const LONDON_TIME_ZONE = "Europe/London";

/** A calendar date, "YYYY-MM-DD". */
export type IsoDate = string;

const DAY_MS = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

let englandHolidays: Holidays | undefined;
const bankHolidaysByYear = new Map<number, readonly IsoDate[]>();
/** Bank holidays of every year loaded so far, as day numbers (days since 1970-01-01). */
const bankHolidayDays = new Set<number>();
const zones = new Map<string, ZoneConverter>();
const dayEnds = new Map<string, number>();
const MAX_CACHED_DAY_ENDS = 10_000;

/** The bank holidays in England and Wales in `year`, sorted, from the date-holidays data. */
export function bankHolidayDates(year: number): IsoDate[] {
  return [...bankHolidaysIn(year)];
}

/** A weekday that is not a bank holiday in England and Wales. */
export function isWorkingDay(date: IsoDate): boolean {
  return isWorkingDayNumber(dayNumber(date));
}

/** The calendar date of `instant` in `timeZone`. */
export function localDate(instant: Date, timeZone: string = LONDON_TIME_ZONE): IsoDate {
  return formatDate(...ymd(localDayNumber(instant, timeZone) * DAY_MS));
}

/** The last millisecond of `date` in `timeZone` (23:59:59.999 local), as a UTC instant. */
export function endOfLocalDay(date: IsoDate, timeZone: string = LONDON_TIME_ZONE): Date {
  return new Date(endOfDayNumber(dayNumber(date), timeZone));
}

/**
 * The end of the `n`th working day after the local day of `fromInstant` (that day is day 0).
 * n = 0 gives the end of that same day.
 */
export function addWorkingDays(fromInstant: Date, n: number, timeZone: string = LONDON_TIME_ZONE): Date {
  requireCount(n, "n");
  let day = localDayNumber(fromInstant, timeZone);
  for (let counted = 0; counted < n;) {
    day += 1;
    if (isWorkingDayNumber(day)) counted += 1;
  }
  return new Date(endOfDayNumber(day, timeZone));
}

/** The end of the `n`th calendar day after the local day of `fromInstant` (that day is day 0). */
export function addCalendarDays(fromInstant: Date, n: number, timeZone: string = LONDON_TIME_ZONE): Date {
  requireCount(n, "n");
  return new Date(endOfDayNumber(localDayNumber(fromInstant, timeZone) + n, timeZone));
}

/**
 * Working days after the local day of `from` up to and including the local day of `to`, so
 * workingDaysBetween(x, addWorkingDays(x, n)) === n. Negative when `to` is on an earlier day.
 */
export function workingDaysBetween(from: Date, to: Date, timeZone: string = LONDON_TIME_ZONE): number {
  const a = localDayNumber(from, timeZone);
  const b = localDayNumber(to, timeZone);
  const [first, last, sign] = a <= b ? [a, b, 1] : [b, a, -1];
  let count = 0;
  for (let day = first + 1; day <= last; day += 1) {
    if (isWorkingDayNumber(day)) count += 1;
  }
  return sign * count;
}

function bankHolidaysIn(year: number): readonly IsoDate[] {
  let dates = bankHolidaysByYear.get(year);
  if (!dates) {
    englandHolidays ??= new Holidays("GB", "ENG");
    // `date` is the local calendar date as "YYYY-MM-DD hh:mm:ss"; observances (Mother's Day…) are skipped.
    dates = [
      ...new Set(
        englandHolidays
          .getHolidays(year)
          .filter((h) => h.type === "public")
          .map((h) => h.date.slice(0, 10)),
      ),
    ].sort();
    for (const date of dates) bankHolidayDays.add(dayNumber(date));
    bankHolidaysByYear.set(year, dates);
  }
  return dates;
}

function isWorkingDayNumber(day: number): boolean {
  const weekday = (((day + 4) % 7) + 7) % 7; // 1970-01-01 was a Thursday; 0 is Sunday
  if (weekday === 0 || weekday === 6) return false;
  bankHolidaysIn(new Date(day * DAY_MS).getUTCFullYear());
  return !bankHolidayDays.has(day);
}

/** Days since 1970-01-01 for a valid "YYYY-MM-DD"; throws otherwise. */
function dayNumber(date: IsoDate): number {
  const m = typeof date === "string" ? ISO_DATE.exec(date) : null;
  if (m) {
    const ms = utcMs(Number(m[1]), Number(m[2]), Number(m[3]));
    if (formatDate(...ymd(ms)) === date) return ms / DAY_MS;
  }
  throw new RangeError(`date must be a calendar date "YYYY-MM-DD", got ${String(date)}`);
}

function localDayNumber(instant: Date, timeZone: string): number {
  return localDayAt(requireInstant(instant, "instant").getTime(), timeZone);
}

/** The last millisecond of local day `day` in `timeZone`, memoised. */
function endOfDayNumber(day: number, timeZone: string): number {
  const key = `${timeZone} ${day}`;
  let end = dayEnds.get(key);
  if (end === undefined) {
    if (dayEnds.size >= MAX_CACHED_DAY_ENDS) dayEnds.clear();
    end = startOfDayNumber(day + 1, timeZone) - 1;
    dayEnds.set(key, end);
  }
  return end;
}

/** The first instant of local day `day` in `timeZone` (the end of the gap if midnight is skipped). */
function startOfDayNumber(day: number, timeZone: string): number {
  const wall = day * DAY_MS;
  // Local midnight is `wall` minus the offset in force then; the offsets a day either side cover
  // one clock change. Keep the candidate that really starts the day.
  const candidates = new Set([wall - DAY_MS, wall, wall + DAY_MS].map((t) => wall - zoneOffsetMs(t, timeZone)));
  const starts = [...candidates].filter((t) => localDayAt(t, timeZone) === day && localDayAt(t - 1, timeZone) === day - 1);
  if (starts.length === 0) {
    throw new RangeError(`cannot find the start of ${formatDate(...ymd(wall))} in ${timeZone}`);
  }
  return Math.min(...starts);
}

function localDayAt(epochMs: number, timeZone: string): number {
  return Math.floor((epochMs + zoneOffsetMs(epochMs, timeZone)) / DAY_MS);
}

/** Local wall time minus UTC at `epochMs`, in ms (the shared Intl-based converter, one per zone). */
function zoneOffsetMs(epochMs: number, timeZone: string): number {
  let zone = zones.get(timeZone);
  if (!zone) {
    zone = new ZoneConverter(timeZone);
    zones.set(timeZone, zone);
  }
  return zone.offsetAt(epochMs);
}

/** Like Date.UTC, without its mapping of years 0–99 to 1900–1999. */
function utcMs(year: number, month: number, day: number, hour = 0, minute = 0, second = 0): number {
  const d = new Date(0);
  d.setUTCFullYear(year, month - 1, day);
  d.setUTCHours(hour, minute, second, 0);
  return d.getTime();
}

function ymd(epochMs: number): [number, number, number] {
  const d = new Date(epochMs);
  return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
}

function formatDate(year: number, month: number, day: number): IsoDate {
  const pad = (n: number, width: number) => String(n).padStart(width, "0");
  return `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
}

function requireInstant(value: Date, name: string): Date {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) {
    throw new RangeError(`${name} must be a valid Date, got ${String(value)}`);
  }
  return value;
}

function requireCount(value: number, name: string): number {
  if (!Number.isInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a whole number of days ≥ 0, got ${String(value)}`);
  }
  return value;
}
