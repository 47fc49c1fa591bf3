// The checks every sensor reading goes through, whatever it came in as (JSON over HTTP or MQTT, or CSV
// over HTTP), and the row each accepted reading becomes for LOAD DATA. Plain numbers and no Date objects
// on the common path: a backfill of a million readings comes through here.
import { AIR_TEMPERATURE_C, RELATIVE_HUMIDITY_PCT, SURFACE_TEMPERATURE_C, formatNumber } from "../readings/csv/limits.js";
import { SENSOR_LATE_LIMIT_DAYS } from "../../../src/lib/schemas/sensor-readings.js";
import type { IngestOutcome } from "./sensor-events.js";

export const BATTERY_PCT = { min: 0, max: 100 } as const;

/** The days a sensor may record in: from the start of its installation day to the end of its removal day (London). */
export interface SensorWindow {
  fromMs: number;
  toMs: number;
  active: boolean;
}

/** What a batch is checked against: the sensor's window and the server's clock. */
export interface ReadingLimits {
  window: SensorWindow;
  /** Earliest and latest reading times taken in (ms). */
  earliestMs: number;
  latestMs: number;
}

/**
 * A checked batch: the accepted readings as LOAD DATA rows (tab-separated `taken_at, air, RH, surface,
 * battery`, `\N` for none; the sensor and the arrival time are the statement's own), how many, the
 * newest reading's time, and each refusal with its reason.
 */
export interface CheckedBatch {
  rows: Buffer;
  count: number;
  newestMs: number;
  refused: IngestOutcome["refused"];
}

/** `2026-12-05T06:45:00Z`, `…:00.123Z`, `…:00+01:00`: seconds required, a zone required. */
const TAKEN_AT = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(\.\d{1,9})?(Z|[+-]\d{2}:\d{2})$/;
const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

const pad2 = (n: number) => (n < 10 ? `0${n}` : String(n));

/** Whole seconds since the epoch (ms, UTC) of a calendar date and time, or null when no such moment exists. */
export function utcMs(year: number, month: number, day: number, hour: number, minute: number, second: number): number | null {
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (
    month < 1 ||
    month > 12 ||
    day < 1 ||
    day > (month === 2 && !leap ? 28 : DAYS_IN_MONTH[month - 1]!) ||
    hour > 23 ||
    minute > 59 ||
    second > 59
  ) {
    return null;
  }
  return Date.UTC(year, month - 1, day, hour, minute, second);
}

/** The reading time in ms (whole seconds, UTC), or a reason. No Date object on the common path. */
export function parseTakenAt(text: string): number | string {
  const m = TAKEN_AT.exec(text);
  if (!m) {
    return /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/.test(text)
      ? "takenAt has no time zone: end it with Z or an offset such as +01:00."
      : "takenAt is not an ISO 8601 date and time (e.g. 2026-12-05T06:45:00Z).";
  }
  let ms = utcMs(+m[1]!, +m[2]!, +m[3]!, +m[4]!, +m[5]!, +m[6]!);
  if (ms === null) return "takenAt is not a real date and time.";
  const zone = m[8]!;
  if (zone !== "Z") {
    if (+zone.slice(1, 3) > 23 || +zone.slice(4, 6) > 59) return "takenAt has an impossible offset.";
    const offsetMin = +zone.slice(1, 3) * 60 + +zone.slice(4, 6);
    ms -= (zone[0] === "-" ? -1 : 1) * offsetMin * 60_000;
  }
  return ms;
}

/** "YYYY-MM-DD HH:MM:SS" in UTC for MariaDB (the connection's zone is UTC). */
export function sqlDateTime(ms: number, text: string): string {
  // The common case (Z, no fraction) is the text itself with a space.
  if (text.length === 20 && text.charCodeAt(19) === 90 /* Z */) return `${text.slice(0, 10)} ${text.slice(11, 19)}`;
  const d = new Date(ms);
  return `${d.getUTCFullYear()}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())} ${pad2(d.getUTCHours())}:${pad2(
    d.getUTCMinutes(),
  )}:${pad2(d.getUTCSeconds())}`;
}

export const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
/** Two decimals, as the columns keep them; never exponent notation for the column's range. */
export const dec2 = (v: number) => String(Math.round(v * 100) / 100);

/** Why a reading's time is refused (in the future, too late, outside the sensor's window), or null. */
export function timeRefusal(ms: number, limits: ReadingLimits): string | null {
  if (ms > limits.latestMs) return "takenAt is in the future (by the server's clock).";
  if (ms < limits.earliestMs) return `takenAt is more than ${SENSOR_LATE_LIMIT_DAYS} days ago: too late to take in.`;
  if (ms < limits.window.fromMs) return "takenAt is before the sensor was installed.";
  if (ms > limits.window.toMs) return "takenAt is after the sensor was removed.";
  return null;
}

/** Why a reading's values are refused (outside the physical ranges), or null. Surface and battery may be absent (null). */
export function valueRefusal(air: number, rh: number, surface: number | null, battery: number | null): string | null {
  if (air < AIR_TEMPERATURE_C.min || air > AIR_TEMPERATURE_C.max) {
    return `airTemperatureC ${formatNumber(air)} °C is outside ${formatNumber(AIR_TEMPERATURE_C.min)}…${AIR_TEMPERATURE_C.max} °C.`;
  }
  if (rh <= RELATIVE_HUMIDITY_PCT.above || rh > RELATIVE_HUMIDITY_PCT.max) {
    return `relativeHumidityPct ${formatNumber(rh)} % is outside the range above 0 and up to 100 %.`;
  }
  if (surface !== null && (surface < SURFACE_TEMPERATURE_C.min || surface > SURFACE_TEMPERATURE_C.max)) {
    return `surfaceTemperatureC ${formatNumber(surface)} °C is outside ${formatNumber(SURFACE_TEMPERATURE_C.min)}…${SURFACE_TEMPERATURE_C.max} °C.`;
  }
  if (battery !== null && (battery < BATTERY_PCT.min || battery > BATTERY_PCT.max)) {
    return `batteryPct ${formatNumber(battery)} is outside 0…100 %.`;
  }
  return null;
}

export const MISSING = {
  air: "airTemperatureC is missing or not a number.",
  rh: "relativeHumidityPct is missing or not a number.",
  surface: "surfaceTemperatureC is not a number.",
  battery: "batteryPct is not a number.",
} as const;

/** The JSON readings (HTTP body or MQTT payload) checked one by one, the accepted ones as LOAD DATA rows. */
export function checkJsonReadings(readings: unknown[], limits: ReadingLimits): CheckedBatch {
  const refused: CheckedBatch["refused"] = [];
  let rows = "";
  let count = 0;
  let newestMs = Number.NEGATIVE_INFINITY;
  for (let index = 0; index < readings.length; index++) {
    const r = readings[index] as Record<string, unknown> | null;
    if (typeof r !== "object" || r === null || Array.isArray(r)) {
      refused.push({ index, takenAt: null, reason: "Not a reading: each reading is an object." });
      continue;
    }
    const text = r.takenAt;
    if (typeof text !== "string") {
      refused.push({ index, takenAt: null, reason: "takenAt is missing or not text." });
      continue;
    }
    const reason = checkJsonReading(r, text, limits);
    if (typeof reason === "string") {
      refused.push({ index, takenAt: text.slice(0, 40), reason });
      continue;
    }
    if (reason > newestMs) newestMs = reason;
    const surface = r.surfaceTemperatureC;
    const battery = r.batteryPct;
    rows += `${sqlDateTime(reason, text)}\t${dec2(r.airTemperatureC as number)}\t${dec2(r.relativeHumidityPct as number)}\t${
      isNum(surface) ? dec2(surface) : "\\N"
    }\t${isNum(battery) ? String(Math.round(battery)) : "\\N"}\n`;
    count++;
  }
  return { rows: Buffer.from(rows, "latin1"), count, newestMs, refused };
}

/** The reading's time in ms, or why it is refused. */
function checkJsonReading(r: Record<string, unknown>, text: string, limits: ReadingLimits): number | string {
  const ms = parseTakenAt(text);
  if (typeof ms === "string") return ms;
  const late = timeRefusal(ms, limits);
  if (late) return late;
  const air = r.airTemperatureC;
  if (!isNum(air)) return MISSING.air;
  const rh = r.relativeHumidityPct;
  if (!isNum(rh)) return MISSING.rh;
  const surface = r.surfaceTemperatureC ?? null;
  if (surface !== null && !isNum(surface)) return MISSING.surface;
  const battery = r.batteryPct ?? null;
  if (battery !== null && !isNum(battery)) return MISSING.battery;
  return valueRefusal(air, rh, surface, battery) ?? ms;
}
