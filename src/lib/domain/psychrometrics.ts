// Moist-air properties in SI units, on psychrolib (ASHRAE Handbook—Fundamentals 2017, ch. 1).
// Temperatures in °C, pressures in Pa, relative humidity in % (0–100) at this module's edge;
// psychrolib itself takes RH as a fraction 0–1.
import psychrolib from "psychrolib";
import { requireFinite, requireRelativeHumidityPct, requireTemperatureC } from "./guards.js";

// The unit system is global to psychrolib: set once, here. The other domain files take psychrolib
// from this module, so it is always in SI before they use it (and any compiler that sees them
// also sees the declaration file referenced above).
psychrolib.SetUnitSystem(psychrolib.SI);
export { psychrolib };

/** Standard atmosphere at sea level. */
export const STANDARD_PRESSURE_PA = 101_325;

/**
 * Specific gas constant of water vapour, J/(kg·K), from the two constants psychrolib takes
 * from ASHRAE 2017 ch. 1: R_da = 287.042 J/(kg·K) and Mw/Mda = 0.621945. Using the same pair
 * keeps absolute humidity consistent with psychrolib's humidity ratio (ρv = W·ρda).
 */
export const GAS_CONSTANT_WATER_VAPOUR = 287.042 / 0.621945;

const ZERO_CELSIUS_K = 273.15;

/**
 * Saturation vapour pressure, Pa: over liquid water above 0.01 °C (ASHRAE eq. 6), over ice at
 * and below it (eq. 5), as psychrolib does.
 */
export function saturationVapourPressurePa(temperatureC: number): number {
  requireTemperatureC(temperatureC, "temperature");
  return psychrolib.GetSatVapPres(temperatureC);
}

/** Partial pressure of water vapour, Pa, from air temperature and relative humidity. */
export function vapourPressurePa(temperatureC: number, relativeHumidityPct: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  return (relativeHumidityPct / 100) * psychrolib.GetSatVapPres(temperatureC);
}

/** Relative humidity, %, of air at a temperature holding a vapour pressure (may exceed 100). */
export function relativeHumidityPctFromVapourPressure(temperatureC: number, vapourPressure: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireVapourPressure(vapourPressure);
  return (100 * vapourPressure) / psychrolib.GetSatVapPres(temperatureC);
}

/**
 * Dew point, °C, by psychrolib's Newton solve on ASHRAE eq. 5/6 (an iterative solve: slow, keep
 * it out of per-reading loops). Below 0.01 °C the saturation curve is over ice, so what comes
 * back there is the frost point — the temperature at which a surface starts to frost.
 */
export function dewPointC(temperatureC: number, relativeHumidityPct: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  if (relativeHumidityPct === 0) throw new RangeError("relative humidity must be above 0 % for a dew point");
  return psychrolib.GetTDewPointFromRelHum(temperatureC, relativeHumidityPct / 100);
}

/**
 * The temperature at which a vapour pressure is the saturation pressure (the dew point of air
 * holding it), °C. psychrolib's solver takes the air temperature as its first guess and as an
 * upper cap; with no air temperature we start from the top of its domain (200 °C), where the cap
 * cannot bite. The solve converges from any start because ln psat is concave in temperature.
 */
export function dewPointFromVapourPressureC(vapourPressure: number): number {
  requireVapourPressure(vapourPressure);
  if (vapourPressure === 0) throw new RangeError("vapour pressure must be above 0 Pa for a dew point");
  return psychrolib.GetTDewPointFromVapPres(200, vapourPressure);
}

/** Vapour pressure, Pa, of air whose dew point is given: the saturation pressure there. */
export function vapourPressureFromDewPointPa(dewPoint: number): number {
  requireTemperatureC(dewPoint, "dew point");
  return psychrolib.GetVapPresFromTDewPoint(dewPoint);
}

/**
 * Absolute humidity (vapour density), g/m³, by the ideal-gas law ρv = pv / (Rv·T). Equal to
 * psychrolib's humidity ratio times the dry-air density, and independent of total pressure.
 */
export function absoluteHumidityGPerM3(temperatureC: number, relativeHumidityPct: number): number {
  return absoluteHumidityFromVapourPressureGPerM3(temperatureC, vapourPressurePa(temperatureC, relativeHumidityPct));
}

export function absoluteHumidityFromVapourPressureGPerM3(temperatureC: number, vapourPressure: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireVapourPressure(vapourPressure);
  return (1000 * vapourPressure) / (GAS_CONSTANT_WATER_VAPOUR * (temperatureC + ZERO_CELSIUS_K));
}

/** Humidity ratio, kg of water per kg of dry air (ASHRAE 2017 ch. 1 eq. 20). */
export function humidityRatio(
  temperatureC: number,
  relativeHumidityPct: number,
  pressurePa: number = STANDARD_PRESSURE_PA,
): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  requirePressure(pressurePa);
  return psychrolib.GetHumRatioFromRelHum(temperatureC, relativeHumidityPct / 100, pressurePa);
}

function requireVapourPressure(value: number): void {
  requireFinite(value, "vapour pressure");
  if (value < 0) throw new RangeError(`vapour pressure must not be negative, got ${value}`);
}

export function requirePressure(value: number): number {
  requireFinite(value, "pressure");
  if (value <= 0) throw new RangeError(`pressure must be above 0 Pa, got ${value}`);
  return value;
}
