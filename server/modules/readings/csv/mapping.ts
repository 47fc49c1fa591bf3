// Which column holds what: proposed from the header names first, then from the values.
import { detectDateFormat, type DateFormat } from "./dates.js";
import { parseNumber } from "./numbers.js";
import { DEFAULT_TIME_ZONE } from "../../../../src/lib/domain/time-zone.js";

export type TemperatureUnit = "C" | "F";

/** Column indexes are 0-based. */
export interface Mapping {
  timestamp: number;
  /** A separate time-of-day column, joined to the date in `timestamp` (files with Date and Time columns). */
  timeOfDay?: number;
  temperature: number;
  humidity: number;
  surfaceTemperature?: number;
  outdoorTemperature?: number;
  /** Unit of the temperature columns; a unit written in a cell ("68 °F") wins for that cell. */
  temperatureUnit: TemperatureUnit;
  dateFormat: DateFormat;
  /** IANA name; times without an offset of their own are in this zone. */
  timeZone: string;
}

/** Overrides for a proposed mapping; null removes an optional column. */
export type MappingOverride = {
  [K in keyof Mapping]?: K extends "timeOfDay" | "surfaceTemperature" | "outdoorTemperature" ? Mapping[K] | null : Mapping[K];
};

export const REQUIRED_ROLES = ["timestamp", "temperature", "humidity"] as const;
export type RequiredRole = (typeof REQUIRED_ROLES)[number];
export const COLUMN_ROLES = [
  "timestamp",
  "timeOfDay",
  "temperature",
  "humidity",
  "surfaceTemperature",
  "outdoorTemperature",
] as const;
export type ColumnRole = (typeof COLUMN_ROLES)[number];

export interface MappingProposal {
  mapping: Partial<Mapping> & Pick<Mapping, "temperatureUnit" | "timeZone">;
  /** Required columns we could not find, each with a sentence saying what we looked for. */
  missing: { field: RequiredRole; message: string }[];
  problems: string[];
}

const normalise = (h: string) => h.toLowerCase().replace(/º/g, "°").replace(/\s+/g, " ").trim();

const IGNORED =
  /dew\s*-?\s*p(oin)?t|(^|[^a-z])(dp|td)([^a-z]|$)|heat\s*index|abs(olute|\.)?\s*hum|g\/m|vpd|vapou?r|wet\s*bulb|batt|volt|serial|^#$|^no\.?$|^nr\.?$|^index$|^record|^sample|^id$|^n$|^seq/;
const SURFACE = /surface|wall/;
const OUTDOOR = /outdoor|outside|external|exterior|(^|[^a-z])out([^a-z]|$)|weather/;
const HUMIDITY = /humid|(^|[^a-z])rh([^a-z]|$)|r\.h\.|^rh/;
const TEMPERATURE = /temp|celsius|fahrenheit|°\s*[cf]|(^|[^a-z])deg\.?\s*[cf]([^a-z]|$)|^t\s*(\(|\[|$)|^air$/;
const TIMESTAMP = /time|date|(^|[^a-z])utc([^a-z]|$)|epoch|(^|[^a-z])when([^a-z]|$)/;
const DATE_ONLY_HEADER = /^(date|day|datum)(\s*\(.*\))?$/;
const TIME_ONLY_HEADER = /^(time|hour|clock)(\s*\(.*\))?$/;

/** The role a header names, "ignore" for a column we know we do not want, or null. */
export function roleFromHeader(header: string): ColumnRole | "ignore" | null {
  const h = normalise(header);
  if (h === "") return null;
  if (IGNORED.test(h)) return "ignore";
  const humidity = HUMIDITY.test(h);
  const temperature = TEMPERATURE.test(h);
  if (SURFACE.test(h)) return temperature && !humidity ? "surfaceTemperature" : "ignore";
  if (OUTDOOR.test(h)) return humidity ? "ignore" : temperature || !TIMESTAMP.test(h) ? "outdoorTemperature" : "ignore";
  if (humidity) return "humidity";
  if (temperature) return "temperature";
  if (TIMESTAMP.test(h)) return "timestamp";
  return null;
}

/** The temperature unit a header names, or null. */
export function unitFromHeader(header: string): TemperatureUnit | null {
  const h = normalise(header);
  if (/°\s*f|deg\.?\s*f|fahrenheit|[([]\s*f\s*[)\]]|(^|[^a-z])f$/.test(h)) return "F";
  if (/°\s*c|deg\.?\s*c|celsius|[([]\s*c\s*[)\]]|(^|[^a-z])c$/.test(h)) return "C";
  return null;
}

interface ColumnFacts {
  index: number;
  values: string[];
  /** Non-empty values. */
  present: number;
  numbers: number[];
  cellUnits: { C: number; F: number; pct: number };
  /** 0 or 1, then 2, 3…: a row counter, not a measurement. */
  counter: boolean;
}

function columnFacts(rows: readonly string[][], index: number, decimalComma: boolean): ColumnFacts {
  const values = rows.map((r) => (r[index] ?? "").trim());
  const numbers: number[] = [];
  const cellUnits = { C: 0, F: 0, pct: 0 };
  let present = 0;
  for (const v of values) {
    if (v === "") continue;
    present++;
    const n = parseNumber(v, decimalComma);
    if (n === null) continue;
    numbers.push(n.value);
    if (n.unit === "C") cellUnits.C++;
    else if (n.unit === "F") cellUnits.F++;
    else if (n.unit === "%") cellUnits.pct++;
  }
  const counter =
    numbers.length >= 3 &&
    numbers[0] <= 1 &&
    numbers.every((n, i) => Number.isInteger(n) && (i === 0 || n === numbers[i - 1] + 1));
  return { index, values, present, numbers, cellUnits, counter };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? Number.NaN : s[s.length >> 1];
};
const isNumeric = (c: ColumnFacts) => c.present > 0 && c.numbers.length / c.present >= 0.8 && !c.counter;
const fitsHumidity = (c: ColumnFacts) => c.numbers.every((n) => n > 0 && n <= 100);
const label = (headers: readonly string[] | null, i: number) =>
  headers && headers[i]?.trim() ? `“${headers[i].trim()}”` : `column ${i + 1}`;

/**
 * The unit of a temperature column: the header's, then the units written in the cells, then the
 * values themselves (`fromValues`): a median over 45 is °F, as indoor air over 45 °C is
 * implausible and 45–95 °F is an ordinary room.
 */
export function temperatureUnitOf(
  header: string | null,
  rows: readonly string[][],
  index: number,
  decimalComma: boolean,
): { unit: TemperatureUnit; fromValues: boolean } {
  const fromHeader = header === null ? null : unitFromHeader(header);
  if (fromHeader) return { unit: fromHeader, fromValues: false };
  const t = columnFacts(rows, index, decimalComma);
  if (t.cellUnits.F > t.cellUnits.C) return { unit: "F", fromValues: false };
  if (t.cellUnits.C === 0 && median(t.numbers) > 45) return { unit: "F", fromValues: true };
  return { unit: "C", fromValues: false };
}

/**
 * A mapping for `rows` (data rows only, a sample is enough) given the header cells, or null when
 * the file has no header row.
 */
export function proposeMapping(
  headers: readonly string[] | null,
  rows: readonly string[][],
  decimalComma: boolean,
): MappingProposal {
  const width = Math.max(headers?.length ?? 0, ...rows.map((r) => r.length));
  const facts = Array.from({ length: width }, (_, i) => columnFacts(rows, i, decimalComma));
  const taken = new Set<number>();
  const found: Partial<Record<ColumnRole, number>> = {};
  const problems: string[] = [];
  const guessed: string[] = [];
  const assign = (role: ColumnRole, index: number) => {
    found[role] = index;
    taken.add(index);
  };

  // 1. Header names; the first column naming a role gets it.
  const headerRoles = headers ? headers.map(roleFromHeader) : [];
  headerRoles.forEach((role, i) => {
    if (role === "ignore") taken.add(i);
    else if (role !== null && found[role] === undefined) assign(role, i);
  });

  // 2. A Date column beside a Time column.
  let dateFormat: DateFormat | undefined;
  let ambiguousDayMonth = false;
  if (headers) {
    const dateCol = headers.findIndex((h) => DATE_ONLY_HEADER.test(normalise(h)));
    const timeCol = headers.findIndex((h) => TIME_ONLY_HEADER.test(normalise(h)));
    if (dateCol !== -1 && timeCol !== -1 && dateCol !== timeCol) {
      const joined = rows.map((r) => `${(r[dateCol] ?? "").trim()} ${(r[timeCol] ?? "").trim()}`);
      const guess = detectDateFormat(joined);
      if (guess) {
        taken.add(dateCol).add(timeCol);
        found.timestamp = dateCol;
        found.timeOfDay = timeCol;
        dateFormat = guess.format;
        ambiguousDayMonth = guess.ambiguousDayMonth;
      }
    }
  }

  // 3. The timestamp column's format; without a usable header, the first column of dates.
  if (dateFormat === undefined) {
    if (found.timestamp !== undefined) {
      const guess = detectDateFormat(facts[found.timestamp].values);
      if (guess) {
        dateFormat = guess.format;
        ambiguousDayMonth = guess.ambiguousDayMonth;
      } else {
        const example = facts[found.timestamp].values.find((v) => v !== "");
        problems.push(
          `The dates in ${label(headers, found.timestamp)} are not in a format we know${example ? ` (for example “${example}”)` : ""}. ` +
            "Choose the date format, or save the file with dates like 2026-01-15 07:00:00.",
        );
      }
    } else {
      for (const c of facts) {
        if (taken.has(c.index) || c.counter) continue;
        const guess = detectDateFormat(c.values);
        if (guess) {
          assign("timestamp", c.index);
          dateFormat = guess.format;
          ambiguousDayMonth = guess.ambiguousDayMonth;
          guessed.push(`time = ${label(headers, c.index)}`);
          break;
        }
      }
    }
  }
  if (ambiguousDayMonth) {
    problems.push(
      "The dates could be day-first or month-first (no day is over 12 in the first rows); we read them as day/month/year. Change the date format if they are month/day/year.",
    );
  }

  // 4. Temperature and humidity from the values: a unit in the cells first, then column order
  //    (loggers write temperature before humidity), humidity having to lie in 0–100.
  const numeric = facts.filter((c) => !taken.has(c.index) && isNumeric(c));
  if (found.humidity === undefined) {
    const byUnit = numeric.find((c) => c.cellUnits.pct > 0 && c.index !== found.temperature);
    if (byUnit) {
      assign("humidity", byUnit.index);
      guessed.push(`humidity = ${label(headers, byUnit.index)}`);
    }
  }
  if (found.temperature === undefined) {
    const byUnit = numeric.find((c) => !taken.has(c.index) && c.cellUnits.C + c.cellUnits.F > 0);
    const first = byUnit ?? numeric.find((c) => !taken.has(c.index));
    if (first) {
      assign("temperature", first.index);
      guessed.push(`temperature = ${label(headers, first.index)}`);
    }
  }
  if (found.humidity === undefined) {
    const next = numeric.find((c) => !taken.has(c.index) && fitsHumidity(c));
    if (next) {
      assign("humidity", next.index);
      guessed.push(`humidity = ${label(headers, next.index)}`);
    }
  }
  if (guessed.length > 0) {
    problems.push(
      `${headers ? "Some column names were not recognised" : "The file has no header row"}, so we guessed from the values: ${guessed.join(", ")}. Check these are right.`,
    );
  }

  // 5. Temperature unit.
  let temperatureUnit: TemperatureUnit = "C";
  if (found.temperature !== undefined) {
    const unit = temperatureUnitOf(headers?.[found.temperature] ?? null, rows, found.temperature, decimalComma);
    temperatureUnit = unit.unit;
    if (unit.fromValues) {
      problems.push(
        `The temperatures in ${label(headers, found.temperature)} look like °F, so we read them as °F. Change the unit if they are °C.`,
      );
    }
  }

  const missing: MappingProposal["missing"] = [];
  if (found.timestamp === undefined || dateFormat === undefined) {
    missing.push({
      field: "timestamp",
      message:
        found.timestamp === undefined
          ? "We could not find a column of dates and times (a header such as “Timestamp”, “Date/Time” or “Time”, with values like 2026-01-15 07:00:00 or 15/01/2026 07:00)."
          : `We could not read the dates in ${label(headers, found.timestamp)}.`,
    });
  }
  if (found.temperature === undefined) {
    missing.push({
      field: "temperature",
      message:
        "We could not find a temperature column (a header such as “Temperature (°C)”, “Temp °F” or “Celsius”, with numbers).",
    });
  }
  if (found.humidity === undefined) {
    missing.push({
      field: "humidity",
      message:
        "We could not find a humidity column (a header such as “Humidity (%rh)”, “RH” or “Relative humidity”, with numbers from 0 to 100).",
    });
  }

  const mapping: MappingProposal["mapping"] = { temperatureUnit, timeZone: DEFAULT_TIME_ZONE };
  for (const role of COLUMN_ROLES) if (found[role] !== undefined) mapping[role] = found[role];
  if (dateFormat !== undefined) mapping.dateFormat = dateFormat;
  return { mapping, missing, problems };
}
