// One CSV record to one reading, or the reasons it cannot be one. Hot path of the import: no
// allocation beyond the reading's own strings: the caller passes the object to fill.
import { parseDateTime } from "./dates.js";
import {
  AIR_TEMPERATURE_C,
  EARLIEST_READING_MS,
  FUTURE_TOLERANCE_MS,
  OUTDOOR_TEMPERATURE_C,
  RELATIVE_HUMIDITY_PCT,
  SURFACE_TEMPERATURE_C,
  formatNumber,
} from "./limits.js";
import type { Mapping } from "./mapping.js";
import { fahrenheitToCelsius, parseNumber, round2 } from "./numbers.js";
import { ZoneConverter } from "../../../../src/lib/domain/time-zone.js";

export interface RowConverterOptions {
  decimalComma: boolean;
  /** Server clock, ms: readings more than a day after it are rejected. */
  nowMs: number;
}

/** One reading, in the units and form the database takes. Reused from row to row by the import. */
export interface ConvertedRow {
  /** 'YYYY-MM-DD HH:mm:ss', UTC. */
  takenAt: string;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  outdoorTemperatureC: number | null;
}

export const emptyRow = (): ConvertedRow => ({
  takenAt: "",
  airTemperatureC: 0,
  relativeHumidityPct: 0,
  surfaceTemperatureC: null,
  outdoorTemperatureC: null,
});

/** Fills `out` and returns null, or returns the reasons (joined by "; ") and leaves `out` in an unknown state. */
export type RowConverter = (record: readonly string[], out: ConvertedRow) => string | null;

const quote = (raw: string) => `'${raw.length > 40 ? `${raw.slice(0, 40)}…` : raw}'`;

const TWO_DIGITS = Array.from({ length: 60 }, (_, i) => (i < 10 ? `0${i}` : String(i)));
const DAY_MS = 86_400_000;
let cachedDay = Number.NaN;
let cachedDayText = "";

/** 'YYYY-MM-DD HH:mm:ss' for a UTC instant (whole seconds, rounded down), as the DATETIME column takes it. */
export function toSqlUtc(ms: number): string {
  const day = Math.floor(ms / DAY_MS);
  if (day !== cachedDay) {
    cachedDay = day;
    cachedDayText = `${new Date(day * DAY_MS).toISOString().slice(0, 10)} `;
  }
  let s = Math.floor((ms - day * DAY_MS) / 1000);
  const h = (s / 3600) | 0;
  s -= h * 3600;
  const m = (s / 60) | 0;
  return cachedDayText + TWO_DIGITS[h] + ":" + TWO_DIGITS[m] + ":" + TWO_DIGITS[s - m * 60];
}

export function createRowConverter(mapping: Mapping, options: RowConverterOptions): RowConverter {
  const zone = new ZoneConverter(mapping.timeZone);
  const { decimalComma } = options;
  const latestMs = options.nowMs + FUTURE_TOLERANCE_MS;
  const { timestamp, timeOfDay, temperature, humidity, surfaceTemperature, outdoorTemperature, temperatureUnit, dateFormat } =
    mapping;

  /** °C rounded to 2 dp, or a reason. `optional`: an empty cell is null. */
  const celsius = (
    raw: string | undefined,
    name: string,
    range: { min: number; max: number },
    optional: boolean,
  ): number | null | string => {
    const text = raw === undefined ? "" : raw.trim();
    if (text === "") return optional ? null : `${name} is missing`;
    const n = parseNumber(text, decimalComma);
    if (n === null || n.unit === "%") return `${name} ${quote(text)} is not a number`;
    const unit = n.unit ?? temperatureUnit;
    const c = round2(unit === "F" ? fahrenheitToCelsius(n.value) : n.value);
    if (c < range.min || c > range.max) {
      const shown = unit === "F" ? `${formatNumber(n.value)} °F (${formatNumber(c)} °C)` : `${formatNumber(c)} °C`;
      return `${name} ${shown} is outside ${formatNumber(range.min)}…${formatNumber(range.max)} °C`;
    }
    return c;
  };

  return (record, out) => {
    let reasons: string | null = null;

    // Time.
    let takenAt = "";
    let text = record[timestamp] ?? "";
    if (timeOfDay !== undefined) text = `${text.trim()} ${(record[timeOfDay] ?? "").trim()}`;
    let wall = parseDateTime(text, dateFormat);
    if (wall === null) {
      text = text.trim();
      wall = parseDateTime(text, dateFormat);
    }
    if (wall === null) reasons = text === "" ? "time is missing" : `time ${quote(text)} is not a date`;
    else {
      const utc = wall.offsetMinutes !== null ? wall.wallMs - wall.offsetMinutes * 60_000 : zone.toUtc(wall.wallMs);
      if (Number.isNaN(utc)) reasons = `time ${quote(text)} does not exist in ${mapping.timeZone} (the clocks went forward then)`;
      else if (utc < EARLIEST_READING_MS) reasons = `time ${quote(text)} is before the year 2000`;
      else if (utc > latestMs) reasons = `time ${quote(text)} is in the future`;
      else takenAt = toSqlUtc(utc);
    }

    const air = celsius(record[temperature], "air temperature", AIR_TEMPERATURE_C, false);
    if (typeof air === "string") reasons = join(reasons, air);

    let rh: number | null = null;
    const rhText = (record[humidity] ?? "").trim();
    if (rhText === "") reasons = join(reasons, "humidity is missing");
    else {
      const n = parseNumber(rhText, decimalComma);
      if (n === null || n.unit === "C" || n.unit === "F") reasons = join(reasons, `humidity ${quote(rhText)} is not a number`);
      else {
        rh = round2(n.value);
        if (rh > RELATIVE_HUMIDITY_PCT.max) reasons = join(reasons, `humidity ${formatNumber(rh)} is over 100 %`);
        else if (rh <= RELATIVE_HUMIDITY_PCT.above) reasons = join(reasons, `humidity ${formatNumber(rh)} is not above 0 %`);
      }
    }

    const surface =
      surfaceTemperature === undefined
        ? null
        : celsius(record[surfaceTemperature], "surface temperature", SURFACE_TEMPERATURE_C, true);
    if (typeof surface === "string") reasons = join(reasons, surface);
    const outdoor =
      outdoorTemperature === undefined
        ? null
        : celsius(record[outdoorTemperature], "outdoor temperature", OUTDOOR_TEMPERATURE_C, true);
    if (typeof outdoor === "string") reasons = join(reasons, outdoor);

    if (reasons !== null) return reasons;
    out.takenAt = takenAt;
    out.airTemperatureC = air as number;
    out.relativeHumidityPct = rh as number;
    out.surfaceTemperatureC = surface as number | null;
    out.outdoorTemperatureC = outdoor as number | null;
    return null;
  };
}

const join = (reasons: string | null, reason: string) => (reasons === null ? reason : `${reasons}; ${reason}`);

/** A record with nothing in it (an empty line, or only delimiters). */
export function isBlankRecord(record: readonly string[]): boolean {
  for (let i = 0; i < record.length; i++) if (record[i].trim() !== "") return false;
  return true;
}
