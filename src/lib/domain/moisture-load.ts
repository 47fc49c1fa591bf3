// Internal moisture excess and the ISO 13788 internal moisture load classes.
import { requireFinite, requireTemperatureC } from "./guards.js";

/**
 * Outdoor RH assumed when a reading carries an outdoor temperature but no outdoor humidity:
 * 85 %, a usual winter value (common practice, no source). Reasons say when it was used.
 */
export const ASSUMED_OUTDOOR_RH_PCT = 85;

/**
 * Class boundary Δv, g/m³, at an outdoor temperature: 2·class at θe ≤ 0 °C, falling linearly to
 * 0 at θe = 20 °C (ISO 13788 internal moisture load classes; TRADE.md §2, from memory).
 */
export function moistureLoadBoundaryGPerM3(loadClass: number, outdoorTemperatureC: number): number {
  requireTemperatureC(outdoorTemperatureC, "outdoor temperature");
  const atZero = 2 * loadClass;
  if (outdoorTemperatureC <= 0) return atZero;
  if (outdoorTemperatureC >= 20) return 0;
  return atZero * (1 - outdoorTemperatureC / 20);
}

/**
 * The lowest class (1–5) whose boundary at the mean outdoor temperature is at or above the
 * measured excess; above class 5's boundary the answer is 5. At θe ≥ 20 °C every boundary is 0,
 * so any positive excess is class 5 and none is class 1.
 */
export function moistureLoadClass(excessGPerM3: number, outdoorTemperatureC: number): 1 | 2 | 3 | 4 | 5 {
  requireFinite(excessGPerM3, "moisture excess");
  for (const loadClass of [1, 2, 3, 4] as const) {
    if (moistureLoadBoundaryGPerM3(loadClass, outdoorTemperatureC) >= excessGPerM3) return loadClass;
  }
  return 5;
}

/** Classes 4 and 5: the top of the scale, where a high moisture load for the ventilation shows. */
export const HIGH_MOISTURE_LOAD_CLASS = 4;
