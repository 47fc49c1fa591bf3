// Dates and times as people in England read them: Europe/London wall-clock time, with GMT or BST
// said beside it so nobody has to guess which one a deadline is in.
import { DEFAULT_TIME_ZONE, ZoneConverter } from "@/lib/domain/time-zone";

const dateTime = new Intl.DateTimeFormat("en-GB", {
  timeZone: DEFAULT_TIME_ZONE,
  weekday: "short",
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  timeZoneName: "short",
});

const longDate = new Intl.DateTimeFormat("en-GB", { timeZone: DEFAULT_TIME_ZONE, weekday: "long", day: "numeric", month: "long", year: "numeric" });
const clock = new Intl.DateTimeFormat("en-GB", { timeZone: DEFAULT_TIME_ZONE, hour: "2-digit", minute: "2-digit", timeZoneName: "short" });

const valid = (iso: string | null | undefined): Date | null => {
  if (!iso) return null;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
};

/** "Tue, 13 Jan 2026, 17:00 GMT" in London time. */
export function formatLondonDateTime(iso: string | null | undefined): string {
  const d = valid(iso);
  return d ? dateTime.format(d) : (iso ?? "");
}

/** "Tuesday, 13 January 2026 at 17:00 GMT": for letters to tenants. */
export function formatLondonLong(iso: string | null | undefined): string {
  const d = valid(iso);
  return d ? `${longDate.format(d)} at ${clock.format(d)}` : (iso ?? "");
}

const pad = (n: number) => String(n).padStart(2, "0");
const parts = new Intl.DateTimeFormat("en-US", {
  timeZone: DEFAULT_TIME_ZONE,
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
  converter ??= new ZoneConverter(DEFAULT_TIME_ZONE);
  const utc = converter.toUtc(wall);
  return Number.isNaN(utc) ? null : new Date(utc).toISOString();
}
