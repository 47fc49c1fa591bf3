// Physical ranges a reading must fall in. The same numbers as the public API's zod schemas in
// src/lib/schemas/psychrometrics.ts (air −20…50 °C, surfaces −30…50 °C, outdoors −30…40 °C,
// 0 < RH ≤ 100 %); checked here as plain numbers because the import handles a million rows.
export const AIR_TEMPERATURE_C = { min: -20, max: 50 } as const;
export const SURFACE_TEMPERATURE_C = { min: -30, max: 50 } as const;
export const OUTDOOR_TEMPERATURE_C = { min: -30, max: 40 } as const;
/** Relative humidity: more than 0, at most 100 %. */
export const RELATIVE_HUMIDITY_PCT = { above: 0, max: 100 } as const;

/** Earliest reading time we accept (ours: loggers of this kind did not exist much earlier). */
export const EARLIEST_READING_MS = Date.UTC(2000, 0, 1);
/** A reading may be at most this far ahead of the server clock (the same allowance as hand-typed readings). */
export { READING_CLOCK_SKEW_MS as FUTURE_TOLERANCE_MS } from "../../../../src/lib/schemas/readings.js";

/** Formats a number for a message: at most two decimals, a real minus sign. */
export function formatNumber(value: number): string {
  const text = String(Math.round(value * 100) / 100);
  return text.startsWith("-") ? `−${text.slice(1)}` : text;
}
