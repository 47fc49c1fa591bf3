// The column mapping of a logger CSV, as the server proposed it and as a person edits it.
import type { ColumnRef, ImportMapping, ImportPreview } from "../api/types";

export const MAPPED_COLUMNS = ["timestamp", "temperature", "humidity", "surfaceTemperature", "outdoorTemperature"] as const;
export type MappedColumn = (typeof MAPPED_COLUMNS)[number];
export const REQUIRED_COLUMNS: readonly MappedColumn[] = ["timestamp", "temperature", "humidity"];

export const columnLabels: Record<MappedColumn, { label: string; hint?: string }> = {
  timestamp: { label: "Date and time column" },
  temperature: { label: "Air temperature column" },
  humidity: { label: "Humidity column", hint: "Relative humidity, in %." },
  surfaceTemperature: { label: "Surface temperature column", hint: "Only if the logger has a probe on the wall or window." },
  outdoorTemperature: { label: "Outdoor temperature column" },
};

/** The date formats the server reads (server/modules/readings/csv/dates.ts), in words. */
export const DATE_FORMAT_LABELS: Record<string, string> = {
  "ISO 8601": "Year first with dashes, for example 2026-01-15 07:00",
  "DD/MM/YYYY": "Day first, for example 15/01/2026 07:00",
  "MM/DD/YYYY": "Month first, for example 01/15/2026 07:00",
  "YYYY/MM/DD": "Year first with slashes, for example 2026/01/15 07:00",
  "DD.MM.YYYY": "Day first with dots, for example 15.01.2026 07:00",
  "epoch seconds": "Seconds since 1970 (Unix time)",
  "epoch milliseconds": "Milliseconds since 1970",
};

export const TIME_ZONE_LABELS: Record<string, string> = {
  "Europe/London": "UK time, with summer time (Europe/London)",
  UTC: "UTC, the same all year",
};

export function timeZoneOptions(proposed: string): { value: string; label: string }[] {
  const browser = (() => {
    try {
      return Intl.DateTimeFormat().resolvedOptions().timeZone;
    } catch {
      return undefined;
    }
  })();
  const zones = [...new Set(["Europe/London", "UTC", proposed, browser].filter((z): z is string => Boolean(z)))];
  return zones.map((value) => ({ value, label: TIME_ZONE_LABELS[value] ?? value }));
}

/** Column choices use positions as strings ("0", "1"…); "" is "not in this file". */
export interface MappingFields {
  timestamp: string;
  temperature: string;
  humidity: string;
  surfaceTemperature: string;
  outdoorTemperature: string;
  temperatureUnit: "C" | "F";
  dateFormat: string;
  timeZone: string;
}

export function columnCount(preview: ImportPreview): number {
  return Math.max(preview.headers.length, ...preview.sampleRows.map((r) => r.length), 0);
}

export function columnName(preview: ImportPreview, index: number): string {
  const header = preview.hasHeader ? preview.headers[index]?.trim() : undefined;
  return header ? header : `Column ${index + 1}`;
}

function indexOf(preview: ImportPreview, ref: ColumnRef | null | undefined): string {
  if (ref === null || ref === undefined || ref === "") return "";
  if (typeof ref === "number") return Number.isInteger(ref) && ref >= 0 ? String(ref) : "";
  const i = preview.headers.indexOf(ref);
  return i === -1 ? "" : String(i);
}

export function fieldsFromPreview(preview: ImportPreview): MappingFields {
  const m = preview.mapping;
  return {
    timestamp: indexOf(preview, m.timestamp),
    temperature: indexOf(preview, m.temperature),
    humidity: indexOf(preview, m.humidity),
    surfaceTemperature: indexOf(preview, m.surfaceTemperature),
    outdoorTemperature: indexOf(preview, m.outdoorTemperature),
    temperatureUnit: m.temperatureUnit === "F" ? "F" : "C",
    dateFormat: m.dateFormat,
    timeZone: m.timeZone,
  };
}

/** Back to the server's shape: columns named the way it named them (header or position). */
export function mappingFromFields(preview: ImportPreview, fields: MappingFields): ImportMapping {
  const byName = typeof preview.mapping.timestamp === "string" && preview.hasHeader && preview.headers.length > 0;
  const ref = (value: string): ColumnRef => (byName ? (preview.headers[Number(value)] ?? Number(value)) : Number(value));
  const mapping: ImportMapping = {
    timestamp: ref(fields.timestamp),
    temperature: ref(fields.temperature),
    humidity: ref(fields.humidity),
    temperatureUnit: fields.temperatureUnit,
    dateFormat: fields.dateFormat,
    timeZone: fields.timeZone,
  };
  if (fields.surfaceTemperature !== "") mapping.surfaceTemperature = ref(fields.surfaceTemperature);
  if (fields.outdoorTemperature !== "") mapping.outdoorTemperature = ref(fields.outdoorTemperature);
  return mapping;
}

/** Problems to fix before importing, per column. */
export function mappingErrors(fields: MappingFields): Partial<Record<MappedColumn, string>> {
  const errors: Partial<Record<MappedColumn, string>> = {};
  for (const key of REQUIRED_COLUMNS) {
    if (fields[key] === "") errors[key] = `Choose the ${columnLabels[key].label.toLowerCase().replace(" column", "")} column.`;
  }
  const seen = new Map<string, MappedColumn>();
  for (const key of MAPPED_COLUMNS) {
    const value = fields[key];
    if (value === "") continue;
    const other = seen.get(value);
    if (other) errors[key] = `This is the same column as the ${columnLabels[other].label.toLowerCase()}. Choose a different one.`;
    else seen.set(value, key);
  }
  return errors;
}
