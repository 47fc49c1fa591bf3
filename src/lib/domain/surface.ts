// Conditions at an internal surface: its temperature (measured or estimated from a building
// element), its relative humidity, its temperature factor and the resulting state.
import { requireFinite, requireRelativeHumidityPct, requireTemperatureC } from "./guards.js";
import { surfaceSaturationTemperatureC, surfaceSaturationVapourPressurePa, vapourPressurePa } from "./psychrometrics.js";

/** Internal surface resistance for condensation and mould assessment, m²K/W (ISO 13788; from memory). */
export const RSI_OPAQUE_M2K_PER_W = 0.25;
export const RSI_GLAZING_M2K_PER_W = 0.13;

/** Critical temperature factor for dwellings, residential buildings and schools (BRE IP 1/06). */
export const CRITICAL_TEMPERATURE_FACTOR = 0.75;

/**
 * Our own cut-off: a temperature factor from measured temperatures is only worth quoting when
 * indoors is at least 5 K warmer than outdoors. Below that, a 0.5 K sensor error alone moves the
 * factor by 0.1 or more, enough to flip the judgement against 0.75.
 */
export const MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K = 5;

/** Surface relative humidity at which mould can grow, judged on a monthly mean (ISO 13788). */
export const MOULD_SURFACE_RH_PCT = 80;
/** Surface relative humidity at which water condenses: the surface is at or below the dew point. */
export const CONDENSATION_SURFACE_RH_PCT = 100;
/** Our own early-warning margin below the 80 % of ISO 13788: no standard sets it. */
export const BORDERLINE_SURFACE_RH_PCT = 70;

export const ELEMENT_IDS = [
  "single-glazing",
  "old-double-glazing",
  "modern-double-glazing",
  "solid-wall",
  "unfilled-cavity-wall",
  "filled-cavity-wall",
  "insulated-wall",
  "corner-thermal-bridge",
] as const;

export type ElementId = (typeof ELEMENT_IDS)[number];

export interface BuildingElement {
  id: ElementId;
  /** For a dropdown. */
  label: string;
  /** The element inside a sentence: "for single glazing", "for a solid brick wall". */
  phrase: string;
  /** The word reasons use: "the window surface", "the wall surface", "the corner surface". */
  surfaceNoun: "window" | "wall" | "corner";
  kind: "glazing" | "opaque";
  /** Typical U-value (TRADE.md §2, from memory). */
  uValueWPerM2K: number;
  rsiM2KPerW: number;
  /** Temperature factor at the internal surface used to estimate its temperature. */
  fRsi: number;
  /** How fRsi was obtained, in plain words. */
  basis: string;
}

/** fRsi ≈ 1 − U·Rsi for a plane element away from thermal bridges. */
export function temperatureFactorFromUValue(uValueWPerM2K: number, rsiM2KPerW: number): number {
  return 1 - uValueWPerM2K * rsiM2KPerW;
}

function plane(
  id: ElementId,
  label: string,
  phrase: string,
  surfaceNoun: BuildingElement["surfaceNoun"],
  kind: BuildingElement["kind"],
  uValueWPerM2K: number,
  uNote: string,
): BuildingElement {
  const rsiM2KPerW = kind === "glazing" ? RSI_GLAZING_M2K_PER_W : RSI_OPAQUE_M2K_PER_W;
  return {
    id,
    label,
    phrase,
    surfaceNoun,
    kind,
    uValueWPerM2K,
    rsiM2KPerW,
    fRsi: temperatureFactorFromUValue(uValueWPerM2K, rsiM2KPerW),
    basis: `1 − U·Rsi with a typical U-value of ${uValueWPerM2K} W/m²K${uNote} and Rsi ${rsiM2KPerW} m²K/W`,
  };
}

/**
 * Our own assumption (common practice, no source): an external corner of a solid brick wall is
 * taken at fRsi = 0.40, below the plain solid wall's 1 − 2.1·0.25 = 0.475, because two outside
 * faces draw heat from one inside corner. At 20 °C in and 0 °C out that puts the corner at 8.0 °C
 * against 9.5 °C for the plain wall.
 */
export const CORNER_TEMPERATURE_FACTOR = 0.4;

export const BUILDING_ELEMENTS: readonly BuildingElement[] = [
  // TRADE.md gives 4.8–5.7 for single glazing; we take the colder end so an estimate never
  // understates the risk.
  plane("single-glazing", "Single glazing", "single glazing", "window", "glazing", 5.7, " (the colder end of 4.8–5.7)"),
  plane("old-double-glazing", "Older double glazing", "older double glazing", "window", "glazing", 2.8, ""),
  plane("modern-double-glazing", "Modern low-e double glazing", "modern low-e double glazing", "window", "glazing", 1.4, ""),
  plane("solid-wall", "Solid brick wall (225 mm)", "a solid brick wall", "wall", "opaque", 2.1, ""),
  plane("unfilled-cavity-wall", "Cavity wall, unfilled", "an unfilled cavity wall", "wall", "opaque", 1.5, ""),
  plane("filled-cavity-wall", "Cavity wall, filled", "a filled cavity wall", "wall", "opaque", 0.5, ""),
  plane("insulated-wall", "Insulated wall (new build)", "an insulated wall", "wall", "opaque", 0.26, ""),
  {
    id: "corner-thermal-bridge",
    label: "External corner of a solid wall (thermal bridge)",
    phrase: "an external corner of a solid wall",
    surfaceNoun: "corner",
    kind: "opaque",
    uValueWPerM2K: 2.1,
    rsiM2KPerW: RSI_OPAQUE_M2K_PER_W,
    fRsi: CORNER_TEMPERATURE_FACTOR,
    basis:
      "our own assumption: a corner of a solid wall is taken as colder than the plain wall, " +
      `with a temperature factor of ${CORNER_TEMPERATURE_FACTOR.toFixed(2)} instead of the plain solid wall's 0.475`,
  },
];

const ELEMENTS_BY_ID = new Map<string, BuildingElement>(BUILDING_ELEMENTS.map((element) => [element.id, element]));

export function isElementId(value: string): value is ElementId {
  return ELEMENTS_BY_ID.has(value);
}

export function getBuildingElement(id: ElementId): BuildingElement {
  const element = ELEMENTS_BY_ID.get(id);
  if (!element) throw new RangeError(`unknown building element "${String(id)}"`);
  return element;
}

/** θsi = θe + fRsi·(θi − θe). */
export function estimateSurfaceTemperatureC(fRsi: number, indoorTemperatureC: number, outdoorTemperatureC: number): number {
  requireFinite(fRsi, "temperature factor");
  requireTemperatureC(indoorTemperatureC, "indoor temperature");
  requireTemperatureC(outdoorTemperatureC, "outdoor temperature");
  return outdoorTemperatureC + fRsi * (indoorTemperatureC - outdoorTemperatureC);
}

/**
 * fRsi = (θsi − θe)/(θi − θe) from measured temperatures (ISO 13788). Undefined when indoors is
 * less than MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K warmer than outdoors (our own cut-off).
 */
export function temperatureFactor(
  surfaceTemperatureC: number,
  indoorTemperatureC: number,
  outdoorTemperatureC: number,
): number | undefined {
  requireTemperatureC(surfaceTemperatureC, "surface temperature");
  requireTemperatureC(indoorTemperatureC, "indoor temperature");
  requireTemperatureC(outdoorTemperatureC, "outdoor temperature");
  const difference = indoorTemperatureC - outdoorTemperatureC;
  if (difference < MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K) return undefined;
  return (surfaceTemperatureC - outdoorTemperatureC) / difference;
}

/**
 * Relative humidity at a surface, %: the room's vapour pressure over the saturation pressure at
 * the surface temperature — over ice at or below 0.01 °C, over water above (ISO 13788, from memory).
 * Left as the raw ratio: above 100 the surface is below the dew point (frost point below 0 °C).
 */
export function surfaceRelativeHumidityPct(vapourPressure: number, surfaceTemperatureC: number): number {
  requireFinite(vapourPressure, "vapour pressure");
  return (100 * vapourPressure) / surfaceSaturationVapourPressurePa(surfaceTemperatureC);
}

export type SurfaceState = "condensing" | "mould-risk" | "borderline" | "dry";

/** From driest to wettest: a colder surface never moves left in this list. */
export const SURFACE_STATES: readonly SurfaceState[] = ["dry", "borderline", "mould-risk", "condensing"];

export function surfaceState(surfaceRelativeHumidity: number): SurfaceState {
  requireFinite(surfaceRelativeHumidity, "surface relative humidity");
  if (surfaceRelativeHumidity >= CONDENSATION_SURFACE_RH_PCT) return "condensing";
  if (surfaceRelativeHumidity >= MOULD_SURFACE_RH_PCT) return "mould-risk";
  if (surfaceRelativeHumidity >= BORDERLINE_SURFACE_RH_PCT) return "borderline";
  return "dry";
}

export interface MinimumTemperatureFactorInput {
  indoorTemperatureC: number;
  indoorRelativeHumidityPct: number;
  outdoorTemperatureC: number;
  /** 80 % for mould (default); 100 % for condensation on glazing and frames (ISO 13788). */
  criticalSurfaceRhPct?: number;
}

export interface MinimumTemperatureFactor {
  internalVapourPressurePa: number;
  minimumSaturationPressurePa: number;
  minimumSurfaceTemperatureC: number;
  fRsiMin: number;
}

/**
 * ISO 13788 monthly method for one month: pi from the indoor conditions, psat,min = pi/φcrit,
 * θsi,min where the saturation pressure equals psat,min (over ice below 0 °C, as ISO 13788's own
 * formula does), fRsi,min = (θsi,min − θe)/(θi − θe).
 * The caller supplies pi through the indoor RH (the design route pi = pe + 1.10·Δp is the
 * caller's to apply before converting to RH).
 */
export function minimumTemperatureFactor(input: MinimumTemperatureFactorInput): MinimumTemperatureFactor {
  const { indoorTemperatureC, indoorRelativeHumidityPct, outdoorTemperatureC } = input;
  const critical = input.criticalSurfaceRhPct ?? MOULD_SURFACE_RH_PCT;
  requireRelativeHumidityPct(critical, "critical surface relative humidity");
  if (critical === 0) throw new RangeError("critical surface relative humidity must be above 0 %");
  requireTemperatureC(outdoorTemperatureC, "outdoor temperature");
  if (!(indoorTemperatureC > outdoorTemperatureC)) {
    throw new RangeError("a temperature factor needs indoors warmer than outdoors");
  }
  const internalVapourPressurePa = vapourPressurePa(indoorTemperatureC, indoorRelativeHumidityPct);
  const minimumSaturationPressurePa = internalVapourPressurePa / (critical / 100);
  const minimumSurfaceTemperatureC = surfaceSaturationTemperatureC(minimumSaturationPressurePa);
  return {
    internalVapourPressurePa,
    minimumSaturationPressurePa,
    minimumSurfaceTemperatureC,
    fRsiMin: (minimumSurfaceTemperatureC - outdoorTemperatureC) / (indoorTemperatureC - outdoorTemperatureC),
  };
}
