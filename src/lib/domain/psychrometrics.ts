// Moist-air properties in SI units, on psychrolib (ASHRAE Handbook—Fundamentals 2017, ch. 1).
// Temperatures in °C, pressures in Pa, relative humidity in % (0–100) at this module's edge;
// psychrolib itself takes RH as a fraction 0–1.
import psychrolib from "psychrolib";
import {
  MAX_TEMPERATURE_C,
  MIN_TEMPERATURE_C,
  requireFinite,
  requireRelativeHumidityPct,
  requireTemperatureC,
} from "./guards.js";

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

// Conventions below 0 °C (tests/domain/psychrometrics-below-zero.test.ts checks each against published values):
// 1. A relative humidity reading is relative to liquid water at every temperature, below 0 °C too (the WMO
//    convention: WMO-No. 8, Guide to Instruments and Methods of Observation, Annex 4.B; annex from memory).
//    psychrolib's GetSatVapPres switches to ice at 0.01 °C and has no "over water" switch, so the water
//    curve is implemented here, with the same ASHRAE constants.
// 2. dewPointC is over water; the frost point (over ice) is its own figure, given when the dew point is below 0 °C.
// 3. A surface at or below the triple point is judged against saturation over ice (ISO 13788, from memory).

/** Triple point of water, °C: where ASHRAE eq. 5 (ice) and eq. 6 (water) meet, as in psychrolib. */
export const TRIPLE_POINT_C = 0.01;

/**
 * ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 6 (Hyland & Wexler 1983), saturation over liquid water,
 * ln pws = C8/T + C9 + C10·T + C11·T² + C12·T³ + C13·ln T, T in K, pws in Pa. ASHRAE states it for
 * 0–200 °C (from memory); below 0 °C it is taken as the supercooled-water curve, which the tests check
 * against Murphy & Koop (2005) and WMO-No. 8 down to −30 °C.
 */
const C8 = -5.8002206e3;
const C9 = 1.3914993;
const C10 = -4.8640239e-2;
const C11 = 4.1764768e-5;
const C12 = -1.4452093e-8;
const C13 = 6.5459673;

/**
 * ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5 (Hyland & Wexler 1983), saturation over ice from
 * −100 °C to the triple point: ln pws = C1/T + C2 + C3·T + C4·T² + C5·T³ + C6·T⁴ + C7·ln T.
 */
const C1 = -5.6745359e3;
const C2 = 6.3925247;
const C3 = -9.677843e-3;
const C4 = 6.2215701e-7;
const C5 = 2.0747825e-9;
const C6 = -9.484024e-13;
const C7 = 4.1635019;

const lnWater = (T: number): number => C8 / T + C9 + T * (C10 + T * (C11 + T * C12)) + C13 * Math.log(T);
const dLnWater = (T: number): number => -C8 / (T * T) + C10 + T * (2 * C11 + 3 * C12 * T) + C13 / T;
const lnIce = (T: number): number => C1 / T + C2 + T * (C3 + T * (C4 + T * (C5 + T * C6))) + C7 * Math.log(T);
const dLnIce = (T: number): number => -C1 / (T * T) + C3 + T * (2 * C4 + T * (3 * C5 + 4 * C6 * T)) + C7 / T;

/** Saturation vapour pressure over liquid water, Pa (eq. 6), unchecked: for loops whose inputs are guarded. */
export const psatWaterPa = (temperatureC: number): number => Math.exp(lnWater(temperatureC + ZERO_CELSIUS_K));
/** Saturation vapour pressure over ice, Pa (eq. 5), unchecked. */
export const psatIcePa = (temperatureC: number): number => Math.exp(lnIce(temperatureC + ZERO_CELSIUS_K));
/** Saturation at a surface (convention 3): over ice at and below the triple point, over water above. Unchecked. */
export const psatSurfacePa = (temperatureC: number): number =>
  temperatureC <= TRIPLE_POINT_C ? psatIcePa(temperatureC) : psatWaterPa(temperatureC);

/** Saturation vapour pressure over liquid water, Pa, at any temperature in the domain (convention 1). */
export function saturationVapourPressurePa(temperatureC: number): number {
  requireTemperatureC(temperatureC, "temperature");
  return psatWaterPa(temperatureC);
}

/** Saturation vapour pressure over ice, Pa, from −100 °C to the triple point (0.01 °C). */
export function saturationVapourPressureOverIcePa(temperatureC: number): number {
  requireTemperatureC(temperatureC, "temperature");
  if (temperatureC > TRIPLE_POINT_C)
    throw new RangeError(`ice needs a temperature at or below ${TRIPLE_POINT_C} °C, got ${temperatureC}`);
  return psatIcePa(temperatureC);
}

/** The saturation pressure a surface is judged against, Pa: over ice at or below 0.01 °C, over water above (ISO 13788). */
export function surfaceSaturationVapourPressurePa(temperatureC: number): number {
  requireTemperatureC(temperatureC, "temperature");
  return psatSurfacePa(temperatureC);
}

/** Partial pressure of water vapour, Pa, from air temperature and relative humidity over water. */
export function vapourPressurePa(temperatureC: number, relativeHumidityPct: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  return (relativeHumidityPct / 100) * psatWaterPa(temperatureC);
}

/** Relative humidity over water, %, of air at a temperature holding a vapour pressure (may exceed 100). */
export function relativeHumidityPctFromVapourPressure(temperatureC: number, vapourPressure: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireVapourPressure(vapourPressure);
  return (100 * vapourPressure) / psatWaterPa(temperatureC);
}

/** Dew point, °C: where the saturation pressure over water equals the air's vapour pressure, at any temperature. */
export function dewPointC(temperatureC: number, relativeHumidityPct: number): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  if (relativeHumidityPct === 0) throw new RangeError("relative humidity must be above 0 % for a dew point");
  return Math.min(waterSaturationTemperatureC((relativeHumidityPct / 100) * psatWaterPa(temperatureC)), temperatureC);
}

/**
 * Frost point, °C: where the saturation pressure over ice equals the air's vapour pressure. Null when the
 * dew point is at or above 0 °C (the vapour pressure is at least e_w(0 °C)): the surface then wets, not frosts.
 * It may lie above a sub-zero air temperature: air near saturation over water is supersaturated over ice.
 */
export function frostPointC(temperatureC: number, relativeHumidityPct: number): number | null {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  if (relativeHumidityPct === 0) throw new RangeError("relative humidity must be above 0 % for a frost point");
  return frostPointOf((relativeHumidityPct / 100) * psatWaterPa(temperatureC));
}

/** The frost point of air holding a vapour pressure, or null when its dew point is not below 0 °C. Unchecked. */
export function frostPointOf(vapourPressure: number): number | null {
  return vapourPressure < WATER_AT_ZERO_PA ? iceSaturationTemperatureC(vapourPressure) : null;
}

const WATER_AT_ZERO_PA = psatWaterPa(0);

/** The temperature at which a vapour pressure saturates liquid water (the dew point of air holding it), °C. */
export function dewPointFromVapourPressureC(vapourPressure: number): number {
  requireVapourPressure(vapourPressure);
  if (vapourPressure === 0) throw new RangeError("vapour pressure must be above 0 Pa for a dew point");
  return waterSaturationTemperatureC(vapourPressure);
}

/** The temperature at which a vapour pressure saturates ice (the frost point), °C; up to e_i(0.01 °C). */
export function frostPointFromVapourPressureC(vapourPressure: number): number {
  requireVapourPressure(vapourPressure);
  if (vapourPressure === 0) throw new RangeError("vapour pressure must be above 0 Pa for a frost point");
  if (vapourPressure > TRIPLE_POINT_PA) throw new RangeError(`no frost point above ${TRIPLE_POINT_PA.toFixed(3)} Pa`);
  return iceSaturationTemperatureC(vapourPressure);
}

const TRIPLE_POINT_PA = psatIcePa(TRIPLE_POINT_C);

/** The surface temperature at which a vapour pressure saturates the surface (convention 3): ice below the triple point. */
export function surfaceSaturationTemperatureC(vapourPressure: number): number {
  requireVapourPressure(vapourPressure);
  if (vapourPressure === 0) throw new RangeError("vapour pressure must be above 0 Pa");
  return vapourPressure <= TRIPLE_POINT_PA
    ? iceSaturationTemperatureC(vapourPressure)
    : waterSaturationTemperatureC(vapourPressure);
}

/** Vapour pressure, Pa, of air whose dew point (over water) is given. */
export function vapourPressureFromDewPointPa(dewPoint: number): number {
  requireTemperatureC(dewPoint, "dew point");
  return psatWaterPa(dewPoint);
}

// Newton's method on ln p(T), which is concave in T, so it converges from any start inside the domain.
// The start is the Magnus inversion of WMO-No. 8 Annex 4.B (water: 17.62, 243.12 °C; ice: 22.46, 272.62 °C),
// already within about 0.1 K, so two or three steps reach 1e-9 K.
const MAX_NEWTON_STEPS = 50;
const NEWTON_TOLERANCE_K = 1e-9;
const MIN_T_K = MIN_TEMPERATURE_C + ZERO_CELSIUS_K;
const MAX_T_K = MAX_TEMPERATURE_C + ZERO_CELSIUS_K;
const MIN_WATER_PA = psatWaterPa(MIN_TEMPERATURE_C);
const MAX_WATER_PA = psatWaterPa(MAX_TEMPERATURE_C);
const MIN_ICE_PA = psatIcePa(MIN_TEMPERATURE_C);

function waterSaturationTemperatureC(vapourPressure: number): number {
  if (vapourPressure < MIN_WATER_PA || vapourPressure > MAX_WATER_PA) {
    throw new RangeError(`vapour pressure ${vapourPressure} Pa is outside the saturation curve's −100..200 °C`);
  }
  const g = Math.log(vapourPressure / 611.2);
  return solve(lnWater, dLnWater, vapourPressure, (243.12 * g) / (17.62 - g), MAX_T_K);
}

function iceSaturationTemperatureC(vapourPressure: number): number {
  if (vapourPressure < MIN_ICE_PA) {
    throw new RangeError(`vapour pressure ${vapourPressure} Pa is below the ice curve's −100 °C`);
  }
  const g = Math.log(vapourPressure / 611.2);
  return solve(lnIce, dLnIce, vapourPressure, (272.62 * g) / (22.46 - g), TRIPLE_POINT_C + ZERO_CELSIUS_K);
}

function solve(ln: (T: number) => number, dLn: (T: number) => number, p: number, guessC: number, maxK: number): number {
  const target = Math.log(p);
  let T = Math.min(Math.max(guessC + ZERO_CELSIUS_K, MIN_T_K), maxK);
  for (let step = 0; step < MAX_NEWTON_STEPS; step++) {
    const next = Math.min(Math.max(T - (ln(T) - target) / dLn(T), MIN_T_K), maxK);
    if (Math.abs(next - T) < NEWTON_TOLERANCE_K) return next - ZERO_CELSIUS_K;
    T = next;
  }
  throw new RangeError(`no saturation temperature found for ${p} Pa`);
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

/** Humidity ratio, kg of water per kg of dry air (ASHRAE 2017 ch. 1 eq. 20), from RH over water. */
export function humidityRatio(
  temperatureC: number,
  relativeHumidityPct: number,
  pressurePa: number = STANDARD_PRESSURE_PA,
): number {
  requireTemperatureC(temperatureC, "temperature");
  requireRelativeHumidityPct(relativeHumidityPct, "relative humidity");
  requirePressure(pressurePa);
  // From the vapour pressure over water (convention 1): psychrolib's GetHumRatioFromRelHum would take RH over ice below 0.01 °C.
  return psychrolib.GetHumRatioFromVapPres((relativeHumidityPct / 100) * psatWaterPa(temperatureC), pressurePa);
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
