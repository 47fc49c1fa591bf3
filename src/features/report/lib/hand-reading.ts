// Checks a reading typed in by hand. The ranges are those the server accepts
// (src/lib/schemas/psychrometrics.ts: air −20…50 °C, surfaces −30…50 °C, outdoors −30…40 °C,
// 0 < RH ≤ 100 %), with messages for people rather than field names: each a key under `reading.error`
// in the `report` namespace with its values, so the form says it in the person's language.
import { londonLocalInput, londonLocalToIso } from "@/lib/dates";
import type { PointInput } from "@/lib/domain";
import { isFutureReading } from "@/lib/schemas/readings";
import type { HandReading } from "../api/types";

export interface HandReadingFields {
  roomId: string;
  airTemperatureC: string;
  relativeHumidityPct: string;
  surfaceTemperatureC: string;
  outdoorTemperatureC: string;
  /** datetime-local value: "2026-01-15T07:30", local time. */
  takenAt: string;
}

export interface ReadingMessage {
  key: "room" | "required" | "notNumber" | "range" | "rhRequired" | "rhNotNumber" | "rhRange" | "takenAt" | "future" | "year";
  /** `what` names the field ("air", "surface", "outdoor": reading.what.<what>); min and max are °C. */
  values?: { what?: "air" | "surface" | "outdoor"; min?: number; max?: number };
}

export type HandReadingErrors = Partial<Record<keyof HandReadingFields, ReadingMessage>>;

/** Accepts "19,5" as well as "19.5", and a typographic minus. */
export function parseDecimal(text: string): number | undefined {
  const t = text.trim().replace(",", ".").replace("\u2212", "-");
  if (t === "") return undefined;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(t)) return Number.NaN;
  return Number(t);
}

/** Now, for a datetime-local input (London time, as every date on screen, to the minute). */
export const localNow = (date = new Date()): string => londonLocalInput(date);

const inRange = (
  what: "air" | "surface" | "outdoor",
  value: number | undefined,
  min: number,
  max: number,
  required: boolean,
): ReadingMessage | undefined => {
  if (value === undefined) return required ? { key: "required", values: { what } } : undefined;
  if (Number.isNaN(value)) return { key: "notNumber", values: { what } };
  if (value < min || value > max) return { key: "range", values: { what, min, max } };
  return undefined;
};

/** The live preview only needs the air: what the engine can say so far, or null. */
export function previewInput(fields: HandReadingFields): PointInput | null {
  const air = parseDecimal(fields.airTemperatureC);
  const rh = parseDecimal(fields.relativeHumidityPct);
  if (air === undefined || rh === undefined || Number.isNaN(air) || Number.isNaN(rh)) return null;
  if (air < -20 || air > 50 || !(rh > 0 && rh <= 100)) return null;
  const surface = parseDecimal(fields.surfaceTemperatureC);
  const outdoor = parseDecimal(fields.outdoorTemperatureC);
  const input: PointInput = { airTemperatureC: air, relativeHumidityPct: rh };
  if (surface !== undefined && !Number.isNaN(surface) && surface >= -30 && surface <= 50) input.surfaceTemperatureC = surface;
  if (outdoor !== undefined && !Number.isNaN(outdoor) && outdoor >= -30 && outdoor <= 40) input.outdoorTemperatureC = outdoor;
  return input;
}

export function checkHandReading(
  fields: HandReadingFields,
  now = Date.now(),
): { reading?: HandReading; errors: HandReadingErrors } {
  const errors: HandReadingErrors = {};
  const roomId = Number(fields.roomId);
  if (!fields.roomId || !Number.isInteger(roomId) || roomId <= 0) errors.roomId = { key: "room" };

  const air = parseDecimal(fields.airTemperatureC);
  const airError = inRange("air", air, -20, 50, true);
  if (airError) errors.airTemperatureC = airError;

  const rh = parseDecimal(fields.relativeHumidityPct);
  if (rh === undefined) errors.relativeHumidityPct = { key: "rhRequired" };
  else if (Number.isNaN(rh)) errors.relativeHumidityPct = { key: "rhNotNumber" };
  else if (!(rh > 0 && rh <= 100)) errors.relativeHumidityPct = { key: "rhRange" };

  const surface = parseDecimal(fields.surfaceTemperatureC);
  const surfaceError = inRange("surface", surface, -30, 50, false);
  if (surfaceError) errors.surfaceTemperatureC = surfaceError;

  const outdoor = parseDecimal(fields.outdoorTemperatureC);
  const outdoorError = inRange("outdoor", outdoor, -30, 40, false);
  if (outdoorError) errors.outdoorTemperatureC = outdoorError;

  // Typed as London time; null for a time that does not happen (the hour skipped when the clocks go forward).
  const iso = fields.takenAt ? londonLocalToIso(fields.takenAt) : null;
  const at = iso ? new Date(iso) : new Date(Number.NaN);
  if (Number.isNaN(at.getTime())) errors.takenAt = { key: "takenAt" };
  // A few minutes' grace for a phone clock that runs ahead (the server allows the same).
  else if (isFutureReading(at.getTime(), now)) errors.takenAt = { key: "future" };
  else if (at.getUTCFullYear() < 2000) errors.takenAt = { key: "year" };

  if (Object.keys(errors).length > 0) return { errors };
  const reading: HandReading = {
    roomId,
    takenAt: at.toISOString(),
    airTemperatureC: air!,
    relativeHumidityPct: rh!,
  };
  if (surface !== undefined) reading.surfaceTemperatureC = surface;
  if (outdoor !== undefined) reading.outdoorTemperatureC = outdoor;
  return { reading, errors };
}
