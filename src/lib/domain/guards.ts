// Input guards shared by the domain functions. Full validation happens at the API edge (zod);
// these only stop NaN and out-of-domain numbers from turning into silent nonsense.

/** psychrolib's SI domain for the ASHRAE saturation equations: −100 °C to 200 °C. */
export const MIN_TEMPERATURE_C = -100;
export const MAX_TEMPERATURE_C = 200;

export function requireFinite(value: number, name: string): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`);
  }
  return value;
}

export function requireTemperatureC(value: number, name: string): number {
  requireFinite(value, name);
  if (value < MIN_TEMPERATURE_C || value > MAX_TEMPERATURE_C) {
    throw new RangeError(`${name} must be within ${MIN_TEMPERATURE_C}..${MAX_TEMPERATURE_C} °C, got ${value}`);
  }
  return value;
}

export function requireRelativeHumidityPct(value: number, name: string): number {
  requireFinite(value, name);
  if (value < 0 || value > 100) {
    throw new RangeError(`${name} must be within 0..100 %, got ${value}`);
  }
  return value;
}

/** True when an optional numeric field was left out (undefined or null from JSON). */
export function isAbsent<T>(value: T | null | undefined): value is null | undefined {
  return value === undefined || value === null;
}
