// Date-time formats loggers and spreadsheets write. A parsed value is a wall-clock time (the
// fields as written, counted as if they were UTC) plus the UTC offset when the value states one;
// the time zone is applied afterwards (time-zone.ts), so an offset in the value always wins.
//
// Every text format takes: a time of H:mm, H:mm:ss or H:mm:ss.fff (fractions are dropped: the
// database keeps whole seconds), an optional AM/PM, then optionally Z, UTC, GMT or ±hh[:mm].
// The date and time are separated by a space, a comma and space, or (ISO) a T.

export const DATE_FORMATS = [
  "ISO 8601",
  "DD/MM/YYYY",
  "MM/DD/YYYY",
  "YYYY/MM/DD",
  "DD.MM.YYYY",
  "epoch seconds",
  "epoch milliseconds",
] as const;
export type DateFormat = (typeof DATE_FORMATS)[number];

/** Examples for each format, for help text. */
export const DATE_FORMAT_EXAMPLES: Record<DateFormat, string> = {
  "ISO 8601": "2026-01-15T07:00:00Z, 2026-01-15 07:00",
  "DD/MM/YYYY": "15/01/2026 07:00:00, 15-01-26 7:00 AM",
  "MM/DD/YYYY": "01/15/2026 07:00:00 AM",
  "YYYY/MM/DD": "2026/01/15 07:00:00",
  "DD.MM.YYYY": "15.01.2026 07:00",
  "epoch seconds": "1768460400",
  "epoch milliseconds": "1768460400000",
};

export interface WallTime {
  /** The written date and time as milliseconds, counted as if UTC. */
  wallMs: number;
  /** The offset written in the value, in minutes east of UTC; null when none. */
  offsetMinutes: number | null;
}

const TIME = String.raw`(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,]\d{1,9})?)?(?:\s*([AaPp])\.?[Mm]\.?)?`;
const ZONE = String.raw`(?:\s*(Z|(?:UTC|GMT)(?:\s*[+-]\d{1,2}(?::?\d{2})?)?|[+-]\d{2}(?::?\d{2})?))?`;
const SEP = String.raw`(?:[Tt]|,?\s+)`;

// Groups: 1–3 date fields in the order written, 4 hour, 5 minute, 6 second, 7 a/p, 8 zone.
const PATTERNS: Record<
  Exclude<DateFormat, "epoch seconds" | "epoch milliseconds">,
  { re: RegExp; order: "ymd" | "dmy" | "mdy" }
> = {
  "ISO 8601": { re: new RegExp(String.raw`^(\d{4})-(\d{1,2})-(\d{1,2})${SEP}${TIME}${ZONE}$`), order: "ymd" },
  "DD/MM/YYYY": { re: new RegExp(String.raw`^(\d{1,2})[/-](\d{1,2})[/-](\d{4}|\d{2})${SEP}${TIME}${ZONE}$`), order: "dmy" },
  "MM/DD/YYYY": { re: new RegExp(String.raw`^(\d{1,2})[/-](\d{1,2})[/-](\d{4}|\d{2})${SEP}${TIME}${ZONE}$`), order: "mdy" },
  "YYYY/MM/DD": { re: new RegExp(String.raw`^(\d{4})/(\d{1,2})/(\d{1,2})${SEP}${TIME}${ZONE}$`), order: "ymd" },
  "DD.MM.YYYY": { re: new RegExp(String.raw`^(\d{1,2})\.(\d{1,2})\.(\d{4}|\d{2})${SEP}${TIME}${ZONE}$`), order: "dmy" },
};

const EPOCH_S = /^\d{9,10}(?:\.\d+)?$/;
const EPOCH_MS = /^\d{12,13}$/;

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const leap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;

function zoneMinutes(zone: string): number | null {
  const z = zone.toUpperCase();
  if (z === "Z" || z === "UTC" || z === "GMT") return 0;
  const m = /([+-])(\d{1,2})(?::?(\d{2}))?$/.exec(z);
  if (!m) return null;
  const minutes = Number(m[2]) * 60 + (m[3] ? Number(m[3]) : 0);
  if (minutes > 14 * 60) return null;
  return m[1] === "-" ? -minutes : minutes;
}

// Fast path for the fixed-width shapes loggers write most ("2026-01-15 07:00:00",
// "15/01/2026 07:00"): digits read by char code, and the day's start cached, as consecutive
// readings share a day. Anything else, or anything odd, goes through the regular expressions.
let cachedDayKey = -1;
let cachedDayMs = 0;

const digit2 = (s: string, i: number): number => {
  const a = s.charCodeAt(i) - 48;
  const b = s.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
};

function fastFixed(raw: string, format: DateFormat): WallTime | null {
  const n = raw.length;
  const zulu = n === 17 || n === 20 ? raw.charCodeAt(n - 1) === 90 /* Z */ : false;
  const len = zulu ? n - 1 : n;
  if (len !== 16 && len !== 19) return null;
  let year: number, month: number, day: number;
  const sep = raw.charCodeAt(10);
  if (format === "ISO 8601" || format === "YYYY/MM/DD") {
    const dash = format === "ISO 8601" ? 45 : 47;
    if (raw.charCodeAt(4) !== dash || raw.charCodeAt(7) !== dash) return null;
    if (!(sep === 32 || (format === "ISO 8601" && (sep === 84 || sep === 116)))) return null;
    const hi = digit2(raw, 0);
    const lo = digit2(raw, 2);
    if (hi < 0 || lo < 0) return null;
    year = hi * 100 + lo;
    month = digit2(raw, 5);
    day = digit2(raw, 8);
  } else if (format === "DD/MM/YYYY" || format === "MM/DD/YYYY" || format === "DD.MM.YYYY") {
    const c2 = raw.charCodeAt(2);
    if (format === "DD.MM.YYYY" ? c2 !== 46 || raw.charCodeAt(5) !== 46 : (c2 !== 47 && c2 !== 45) || raw.charCodeAt(5) !== c2)
      return null;
    if (sep !== 32 || zulu) return null;
    const hi = digit2(raw, 6);
    const lo = digit2(raw, 8);
    if (hi < 0 || lo < 0) return null;
    year = hi * 100 + lo;
    const a = digit2(raw, 0);
    const b = digit2(raw, 3);
    [day, month] = format === "MM/DD/YYYY" ? [b, a] : [a, b];
  } else return null;
  if (raw.charCodeAt(13) !== 58) return null;
  const hour = digit2(raw, 11);
  const minute = digit2(raw, 14);
  let second = 0;
  if (len === 19) {
    if (raw.charCodeAt(16) !== 58) return null;
    second = digit2(raw, 17);
  }
  if (month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59)
    return null;
  if (day > (month === 2 && leap(year) ? 29 : DAYS[month - 1])) return null;
  const key = (year * 100 + month) * 100 + day;
  if (key !== cachedDayKey) {
    cachedDayKey = key;
    cachedDayMs = Date.UTC(year, month - 1, day);
  }
  return { wallMs: cachedDayMs + ((hour * 60 + minute) * 60 + second) * 1000, offsetMinutes: zulu ? 0 : null };
}

/** The wall time written in `raw` under `format`, or null when it is not a valid date-time of that format. */
export function parseDateTime(raw: string, format: DateFormat): WallTime | null {
  const fast = fastFixed(raw, format);
  if (fast !== null) return fast;
  if (format === "epoch seconds" || format === "epoch milliseconds") {
    const ok = format === "epoch seconds" ? EPOCH_S.test(raw) : EPOCH_MS.test(raw);
    if (!ok) return null;
    const ms = format === "epoch seconds" ? Math.floor(Number(raw)) * 1000 : Number(raw);
    return { wallMs: ms, offsetMinutes: 0 };
  }
  const { re, order } = PATTERNS[format];
  const m = re.exec(raw);
  if (m === null) return null;
  let year: number, month: number, day: number;
  if (order === "ymd") [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  else if (order === "dmy") [day, month, year] = [Number(m[1]), Number(m[2]), Number(m[3])];
  else [month, day, year] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (m[order === "ymd" ? 1 : 3].length === 2) year += 2000;
  if (month < 1 || month > 12) return null;
  if (day < 1 || day > (month === 2 && leap(year) ? 29 : DAYS[month - 1])) return null;
  let hour = Number(m[4]);
  const minute = Number(m[5]);
  const second = m[6] === undefined ? 0 : Number(m[6]);
  if (m[7] !== undefined) {
    if (hour < 1 || hour > 12) return null;
    const pm = m[7] === "p" || m[7] === "P";
    hour = (hour % 12) + (pm ? 12 : 0);
  }
  if (hour > 23 || minute > 59 || second > 59) return null;
  let offsetMinutes: number | null = null;
  if (m[8] !== undefined) {
    offsetMinutes = zoneMinutes(m[8]);
    if (offsetMinutes === null) return null;
  }
  return { wallMs: Date.UTC(year, month - 1, day, hour, minute, second), offsetMinutes };
}

export interface DateFormatGuess {
  format: DateFormat;
  /** Day-first and month-first both fit every value; we chose day-first. */
  ambiguousDayMonth: boolean;
  /** Share of the non-empty values that parse under `format`. */
  share: number;
}

/**
 * The format that reads most of `values` (at least 80 % of the non-empty ones), or null.
 * Slash or dash dates are day-first (DD/MM/YYYY) unless a value has a second field over 12 and
 * none has a first field over 12; when every field is 12 or less we cannot tell and say so.
 */
export function detectDateFormat(values: readonly string[]): DateFormatGuess | null {
  const present = values.map((v) => v.trim()).filter((v) => v !== "");
  if (present.length === 0) return null;
  const share = (format: DateFormat) => present.filter((v) => parseDateTime(v, format) !== null).length / present.length;
  for (const format of ["ISO 8601", "YYYY/MM/DD", "DD.MM.YYYY"] as const) {
    const s = share(format);
    if (s >= 0.8) return { format, ambiguousDayMonth: false, share: s };
  }
  const dmy = share("DD/MM/YYYY");
  const mdy = share("MM/DD/YYYY");
  if (dmy >= 0.8 || mdy >= 0.8) {
    if (dmy === mdy) {
      // Both read every value: no field over 12 anywhere.
      return { format: "DD/MM/YYYY", ambiguousDayMonth: true, share: dmy };
    }
    return dmy > mdy
      ? { format: "DD/MM/YYYY", ambiguousDayMonth: false, share: dmy }
      : { format: "MM/DD/YYYY", ambiguousDayMonth: false, share: mdy };
  }
  for (const format of ["epoch seconds", "epoch milliseconds"] as const) {
    const s = share(format);
    if (s >= 0.8) {
      // Epoch values must land in a plausible span, so a column of counters is not taken for times.
      const times = present.map((v) => parseDateTime(v, format)?.wallMs ?? Number.NaN).filter((t) => !Number.isNaN(t));
      if (times.every((t) => t >= Date.UTC(2000, 0, 1) && t < Date.UTC(2100, 0, 1)))
        return { format, ambiguousDayMonth: false, share: s };
    }
  }
  return null;
}
