// Number formatting for reason strings: fixed decimals rounded half up on the decimal value
// (0.475 → "0.48", which toFixed gets wrong from the binary value), never "-0.0".

export function fixed(value: number, digits: number): string {
  const scale = 10 ** digits;
  const scaled = Number((value * scale).toPrecision(12));
  const text = (Math.round(scaled) / scale).toFixed(digits);
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

export const celsius = (value: number): string => `${fixed(value, 1)} °C`;
export const percent = (value: number): string => `${fixed(value, 0)} %`;
export const factor = (value: number): string => fixed(value, 2);
export const hours = (value: number): string => fixed(value, value < 10 ? 1 : 0);

/** How a surface above saturation is said: the ratio means the surface is colder than the air's dew point. */
export const CONDENSING_WORDS = "condensing (the surface is below the dew point)";

/**
 * Relative humidity at a surface as people read it, on every screen and in every e-mail. The
 * engine keeps the raw ratio (above 100 % when the surface is below the dew point); air cannot
 * hold more than saturated, so anything above 100 % is said as condensing, never as a percentage.
 */
export const surfaceHumidity = (value: number): string => (value > 100 ? CONDENSING_WORDS : percent(value));
