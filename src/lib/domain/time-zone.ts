// Wall-clock times in an IANA time zone to UTC, with the built-in Intl time-zone data.
//
// - A wall time in a spring-forward gap (e.g. 01:30 on the last Sunday of March in London) does
//   not exist: toUtc returns NaN and the row is rejected with a reason.
// - A wall time in an autumn fold (01:30 on the last Sunday of October in London happens twice)
//   takes the FIRST occurrence (the summer-time one, 00:30 UTC). A logger writing local times
//   through the fold repeats the hour; the second pass lands on the same UTC times and is counted
//   as duplicates. Files with explicit offsets (Z, +01:00) or epoch times avoid both.
// - Away from a change of offset, one look-up covers two days of wall times; near one, results
//   are cached per quarter hour (every current zone changes offset on a quarter hour). A million
//   one-minute readings cost about a thousand Intl look-ups.

export const DEFAULT_TIME_ZONE = "Europe/London";

const QUARTER_HOUR_MS = 900_000;
const DAY_MS = 86_400_000;
const CACHE_LIMIT = 100_000;

export function isTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone });
    return true;
  } catch {
    return false;
  }
}

export class ZoneConverter {
  private readonly format: Intl.DateTimeFormat | null;
  private readonly offsets = new Map<number, number>();
  private readonly resolved = new Map<number, number>();
  /** Wall times in [spanFrom, spanTo) all have spanOffset: no change of offset near them. */
  private spanFrom = 0;
  private spanTo = 0;
  private spanOffset = 0;

  constructor(readonly timeZone: string) {
    if (!isTimeZone(timeZone)) throw new RangeError(`unknown time zone ${timeZone}`);
    const utc = ["UTC", "Etc/UTC", "Etc/GMT", "GMT"].includes(timeZone);
    this.format = utc
      ? null
      : new Intl.DateTimeFormat("en-US", {
          timeZone,
          hourCycle: "h23",
          year: "numeric",
          month: "numeric",
          day: "numeric",
          hour: "numeric",
          minute: "numeric",
          second: "numeric",
        });
  }

  /** The zone's offset from UTC at a UTC instant, in ms (positive east of Greenwich). */
  offsetAt(utcMs: number): number {
    if (this.format === null) return 0;
    const key = Math.floor(utcMs / QUARTER_HOUR_MS);
    const hit = this.offsets.get(key);
    if (hit !== undefined) return hit;
    const at = key * QUARTER_HOUR_MS;
    const p: Record<string, number> = {};
    for (const part of this.format.formatToParts(at)) if (part.type !== "literal") p[part.type] = Number(part.value);
    const offset = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second) - at;
    if (this.offsets.size >= CACHE_LIMIT) this.offsets.clear();
    this.offsets.set(key, offset);
    return offset;
  }

  /** UTC ms of a wall-clock time in this zone; NaN when it does not exist; the first occurrence when it happens twice. */
  toUtc(wallMs: number): number {
    if (this.format === null) return wallMs;
    if (wallMs >= this.spanFrom && wallMs < this.spanTo) return wallMs - this.spanOffset;
    // Same offset three days either side (no zone changes twice in six days): the offset holds
    // for the day either side, whose instants lie within those three days whatever the offset.
    const before = this.offsetAt(wallMs - 3 * DAY_MS);
    if (before === this.offsetAt(wallMs + 3 * DAY_MS)) {
      this.spanFrom = wallMs - DAY_MS;
      this.spanTo = wallMs + DAY_MS;
      this.spanOffset = before;
      return wallMs - before;
    }
    const key = Math.floor(wallMs / QUARTER_HOUR_MS);
    let offset = this.resolved.get(key);
    if (offset === undefined) {
      offset = this.resolveOffset(key * QUARTER_HOUR_MS);
      if (this.resolved.size >= CACHE_LIMIT) this.resolved.clear();
      this.resolved.set(key, offset);
    }
    return wallMs - offset;
  }

  /** Offsets in force a day either side; each fits if the zone really has it at the instant it gives. */
  private resolveOffset(wallMs: number): number {
    const before = this.offsetAt(wallMs - DAY_MS);
    const after = this.offsetAt(wallMs + DAY_MS);
    const fitsBefore = this.offsetAt(wallMs - before) === before;
    if (before === after) return fitsBefore ? before : this.offsetAt(wallMs - this.offsetAt(wallMs - before));
    const fitsAfter = this.offsetAt(wallMs - after) === after;
    if (fitsBefore && fitsAfter) return Math.max(before, after); // fold: the earlier instant
    if (fitsBefore) return before;
    if (fitsAfter) return after;
    return Number.NaN; // gap
  }
}
