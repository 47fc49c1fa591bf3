// Every date and time the client shows, in London time (Europe/London) whatever the viewer's own
// zone: a deadline reads the same on every screen and on every machine. Where the hour matters
// (deadlines, appointments, anything someone acts on) the zone is said beside it, "23:59 BST" or
// "23:59 GMT", so nobody has to guess. Calendar dates (YYYY-MM-DD, already London days) are shown as
// they are, never shifted a day.
import { DEFAULT_TIME_ZONE, ZoneConverter } from "./domain/time-zone.js";

/** The zone every date and time is shown in. */
export const LONDON = DEFAULT_TIME_ZONE;

type Format = Pick<Intl.DateTimeFormat, "format" | "formatToParts">;

/**
 * A formatter made when it is first used, not when this module loads: each one costs the browser
 * milliseconds to make (its zone's rules), a page uses a few of the twenty here, and making them all
 * up front held up the queue's first rows by some 150 ms on a cold load (bench:queue).
 */
function lazyFormat(locale: string, options: Intl.DateTimeFormatOptions): Format {
  let made: Intl.DateTimeFormat | undefined;
  const get = () => (made ??= new Intl.DateTimeFormat(locale, options));
  return { format: (d) => get().format(d), formatToParts: (d) => get().formatToParts(d) };
}

const london = (options: Intl.DateTimeFormatOptions) => lazyFormat("en-GB", { timeZone: LONDON, ...options });
/** For calendar dates: read at UTC midnight and written in UTC, so the day never moves. */
const calendar = (options: Intl.DateTimeFormatOptions) => lazyFormat("en-GB", { timeZone: "UTC", ...options });

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** True for a real calendar date written YYYY-MM-DD. */
export function isIsoDate(value: string): boolean {
  if (!ISO_DATE.test(value)) return false;
  const ms = Date.parse(`${value}T00:00:00Z`);
  return !Number.isNaN(ms) && new Date(ms).toISOString().slice(0, 10) === value;
}

const instant = (iso: string | null | undefined): Date | null => {
  if (!iso) return null;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
};
const calendarDay = (date: string): Date => new Date(`${date.slice(0, 10)}T00:00:00Z`);

/** Formats an instant, or gives back what it was given when it is not one (so nothing vanishes). */
const showInstant = (format: Format) => (iso: string | null | undefined) => {
  const d = instant(iso);
  return d ? format.format(d) : (iso ?? "");
};

// ---- Instants (ISO timestamps), in London time ----

const calendarDayMonthYear = calendar({ day: "numeric", month: "long", year: "numeric" });
const dayMonthYear = london({ day: "numeric", month: "long", year: "numeric" });
const dayMonthYearShort = london({ day: "numeric", month: "short", year: "numeric" });
const dateTime = london({ day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" });
const dateTimeZone = london({
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  timeZoneName: "short",
});
const weekdayDateTimeZone = london({
  weekday: "short",
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  timeZoneName: "short",
});
const dayTimeZone = london({ day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", timeZoneName: "short" });
const longWeekdayDate = london({ weekday: "long", day: "numeric", month: "long", year: "numeric" });
const clockZone = london({ hour: "2-digit", minute: "2-digit", timeZoneName: "short" });

/**
 * "3 March 2024". A calendar date ("2024-03-03") is shown as it is; an instant is shown as the
 * London day it falls on.
 */
export function formatDate(value: string | null | undefined): string {
  if (!value) return "";
  if (isIsoDate(value)) return calendarDayMonthYear.format(calendarDay(value));
  return showInstant(dayMonthYear)(value);
}

/** "3 Mar 2024, 14:05", London time: when something happened (a photo, a message, a reading). */
export const formatDateTime = showInstant(dateTime);

/** "3 Mar 2024", the London day of an instant. */
export const formatDay = showInstant(dayMonthYearShort);

/** "3 Mar 2024, 14:05 GMT": a moment someone acts on, with its zone. */
export const formatDateTimeZoned = showInstant(dateTimeZone);

/** "Tue, 13 Jan 2026, 17:00 GMT": deadlines and records in the case workspace. */
export const formatWeekdayDateTimeZoned = showInstant(weekdayDateTimeZone);

const chartDay = london({ day: "numeric", month: "short" });
const chartClock = london({ hour: "2-digit", minute: "2-digit", hourCycle: "h23" });

/**
 * "26 Nov 14:00", London time, from Unix seconds: a chart's time axis and its cursor. An axis
 * passes "\n" as the separator to put the time under the day.
 */
export function formatChartTime(unixSeconds: number, separator = " "): string {
  const d = new Date(unixSeconds * 1000);
  return Number.isNaN(d.getTime()) ? "" : `${chartDay.format(d)}${separator}${chartClock.format(d)}`;
}

/** "3 Mar, 23:59 BST": a deadline in a table, where the year is plain from the context. */
export const formatDayTimeZoned = showInstant(dayTimeZone);

/** "Tuesday, 13 January 2026 at 17:00 GMT": for letters to tenants. */
export function formatLongDateTime(iso: string | null | undefined): string {
  const d = instant(iso);
  return d ? `${longWeekdayDate.format(d)} at ${clockZone.format(d)}` : (iso ?? "");
}

const clock12 = london({ hour: "numeric", minute: "2-digit", hourCycle: "h12" });

/** "2 pm", "10:30 am", "midday", "midnight": a London time of day in plain words, with no zone. */
function plainTime(d: Date): string {
  const parts = Object.fromEntries(clock12.formatToParts(d).map((p) => [p.type, p.value]));
  const hour = Number(parts.hour);
  const minute = parts.minute ?? "00";
  const period = (parts.dayPeriod ?? "").toLowerCase().replace(/\./g, "").trim();
  if (minute === "00" && hour === 12) return period === "am" ? "midnight" : "midday";
  return `${hour}${minute === "00" ? "" : `:${minute}`} ${period}`;
}

/**
 * For letters and e-mails to tenants: "Wednesday 14 January 2026 at 10:30 am", in London time with
 * no zone jargon (no "GMT" or "BST"). A deadline at 23:59 reads "the end of Monday 19 January 2026".
 */
export function formatForTenant(iso: string | null | undefined): string {
  const d = instant(iso);
  if (!d) return iso ?? "";
  const day = longWeekdayDate.format(d).replace(",", "");
  const time = plainTime(d);
  return time === "11:59 pm" ? `the end of ${day}` : `${day} at ${time}`;
}

/** "Thursday 24 December 2026", the London day of an instant. */
export function formatLongDay(iso: string | null | undefined): string {
  const d = instant(iso);
  return d ? longWeekdayDate.format(d).replace(",", "") : (iso ?? "");
}

const isoDay = lazyFormat("en-CA", { timeZone: LONDON, year: "numeric", month: "2-digit", day: "2-digit" });

/** The London calendar date of an instant, YYYY-MM-DD. */
export const londonDateOf = (at: Date): string => isoDay.format(at);

/** Today's date in London, YYYY-MM-DD. */
export const todayInLondon = (now: Date = new Date()): string => londonDateOf(now);

// ---- Calendar dates (YYYY-MM-DD) ----

const calendarLong = calendar({ weekday: "long", day: "numeric", month: "long", year: "numeric" });
const calendarLongNoYear = calendar({ weekday: "long", day: "numeric", month: "long" });
const calendarShort = calendar({ day: "numeric", month: "short", year: "numeric" });

/** "Tuesday 8 December 2026" from "2026-12-08" (without the year when `withYear` is false). */
export function formatCalendarLong(date: string, withYear = true): string {
  if (!isIsoDate(date.slice(0, 10))) return date;
  return (withYear ? calendarLong : calendarLongNoYear).format(calendarDay(date)).replace(",", "");
}

/** "7 Dec 2026" from "2026-12-07". */
export const formatCalendarShort = (date: string): string => (isIsoDate(date) ? calendarShort.format(calendarDay(date)) : date);

// ---- datetime-local inputs, read and written as London time ----

const pad = (n: number) => String(n).padStart(2, "0");
const parts = lazyFormat("en-US", {
  timeZone: LONDON,
  hourCycle: "h23",
  year: "numeric",
  month: "numeric",
  day: "numeric",
  hour: "numeric",
  minute: "numeric",
});

/** Now (or any instant) as a datetime-local value in London time: "2026-01-13T09:30". */
export function londonLocalInput(at: Date = new Date()): string {
  const p: Record<string, number> = {};
  for (const part of parts.formatToParts(at)) if (part.type !== "literal") p[part.type] = Number(part.value);
  return `${p.year}-${pad(p.month!)}-${pad(p.day!)}T${pad(p.hour!)}:${pad(p.minute!)}`;
}

let converter: ZoneConverter | null = null;

/**
 * A datetime-local value read as London time, as an ISO instant. null when it is not a date-time,
 * or names a time that does not happen (the hour skipped when the clocks go forward).
 */
export function londonLocalToIso(value: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value.trim());
  if (!m) return null;
  const [, y, mo, d, h, mi, s] = m.map(Number) as number[];
  const wall = Date.UTC(y!, mo! - 1, d!, h!, mi!, Number.isNaN(s) ? 0 : (s ?? 0));
  const check = new Date(wall);
  if (check.getUTCMonth() !== mo! - 1 || check.getUTCDate() !== d!) return null;
  converter ??= new ZoneConverter(LONDON);
  const utc = converter.toUtc(wall);
  return Number.isNaN(utc) ? null : new Date(utc).toISOString();
}

// ---- In the tenant's language ----

/** Intl's name for a Dewline language: the pseudo-locales read English dates (their words are marked by translation). */
const intlLocale = (lng: string) => (lng === "en-XA" || lng === "ar-XB" ? "en-GB" : lng);
type DateKind = "day" | "dateTime" | "longDay" | "longDayNoYear";
const STYLES: Record<DateKind, Intl.DateTimeFormatOptions> = {
  day: { day: "numeric", month: "long", year: "numeric" },
  longDay: { weekday: "long", day: "numeric", month: "long", year: "numeric" },
  longDayNoYear: { weekday: "long", day: "numeric", month: "long" },
  dateTime: { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" },
};
/**
 * One formatter per language and style (and zone: London for instants, UTC for calendar dates), kept
 * once made: a tenant's list formats a date per row, and each new Intl.DateTimeFormat costs the browser
 * its zone's rules again.
 */
const inLanguage = new Map<string, Format>();
const languageFormat = (lng: string, kind: DateKind, timeZone: string) => {
  const locale = intlLocale(lng);
  const key = `${locale}|${kind}|${timeZone}`;
  let format = inLanguage.get(key);
  if (!format) inLanguage.set(key, (format = lazyFormat(locale, { timeZone, ...STYLES[kind] })));
  return format;
};

/**
 * The same London dates in the language the tenant reads ("5 Rhagfyr 2026", "5 Rhag 2026, 14:05"):
 * `day` for when something was sent, `dateTime` for a message, `longDay` (or `longDayNoYear`) for an
 * appointment's day.
 * A calendar date (YYYY-MM-DD) is shown as it is, never shifted a day.
 */
export function formatDateIn(lng: string, value: string | null | undefined, kind: DateKind = "day"): string {
  if (!value) return "";
  if (isIsoDate(value)) return languageFormat(lng, kind, "UTC").format(calendarDay(value)).replace(",", "");
  const d = instant(value);
  return d
    ? languageFormat(lng, kind, LONDON)
        .format(d)
        .replace(/^([^\d,]+),/, "$1")
    : value;
}

/**
 * "15 Jan 2026, 09:05" (English) or "15 Ion 2026, 09:05" (Welsh): formatDateTime in the reader's
 * language, still London time.
 */
export const formatDateTimeIn = (lng: string, iso: string | null | undefined): string => formatDateIn(lng, iso, "dateTime");
