// One spot reading: air properties, the surface's temperature and humidity, and plain reasons.
import { isAbsent, requireRelativeHumidityPct, requireTemperatureC } from "./guards.js";
import {
  GAS_CONSTANT_WATER_VAPOUR,
  STANDARD_PRESSURE_PA,
  TRIPLE_POINT_C,
  dewPointFromVapourPressureC,
  frostPointOf,
  psatSurfacePa,
  psatWaterPa,
  psychrolib,
  requirePressure,
} from "./psychrometrics.js";
import {
  BORDERLINE_SURFACE_RH_PCT,
  CRITICAL_TEMPERATURE_FACTOR,
  MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K,
  MOULD_SURFACE_RH_PCT,
  getBuildingElement,
  surfaceState,
  temperatureFactor as measuredTemperatureFactor,
} from "./surface.js";
import type { BuildingElement, ElementId, SurfaceState } from "./surface.js";
import { celsius, factor, fixed, percent } from "./wording.js";

export type SurfaceSource = "measured" | "estimated" | "air";

export interface PointInput {
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC?: number;
  outdoorTemperatureC?: number;
  element?: ElementId;
  pressurePa?: number;
}

export interface SurfaceResult {
  temperatureC: number;
  source: SurfaceSource;
  /** Raw ratio, %: above 100 the surface is below the dew point. */
  relativeHumidityPct: number;
  /** Measured (θsi − θe)/(θi − θe), or the element's typical fRsi when estimated. */
  temperatureFactor?: number;
  state: SurfaceState;
}

export interface PointResult {
  /** Over liquid water, at any air temperature (WMO-No. 8 convention). */
  dewPointC: number;
  /** Over ice, when the dew point is below 0 °C: a surface at or below it gathers frost. Null otherwise. */
  frostPointC: number | null;
  vapourPressurePa: number;
  saturationVapourPressurePa: number;
  absoluteHumidityGPerM3: number;
  humidityRatio: number;
  surface: SurfaceResult;
  reasons: string[];
}

export function evaluatePoint(input: PointInput): PointResult {
  const airT = requireTemperatureC(input.airTemperatureC, "air temperature");
  const rh = requireRelativeHumidityPct(input.relativeHumidityPct, "relative humidity");
  if (rh === 0) throw new RangeError("relative humidity must be above 0 %");
  const pressure = isAbsent(input.pressurePa) ? STANDARD_PRESSURE_PA : requirePressure(input.pressurePa);
  const outdoorT = isAbsent(input.outdoorTemperatureC)
    ? undefined
    : requireTemperatureC(input.outdoorTemperatureC, "outdoor temperature");
  const element = isAbsent(input.element) ? undefined : getBuildingElement(input.element);

  // RH is relative to water at any temperature (WMO-No. 8); see psychrometrics.ts for the conventions.
  const psatAir = psatWaterPa(airT);
  const pv = (rh / 100) * psatAir;
  const dewPoint = Math.min(dewPointFromVapourPressureC(pv), airT);
  const frostPoint = frostPointOf(pv);
  const reasons: string[] = [];
  const noun = element ? `The ${element.surfaceNoun} surface` : "The surface";

  let source: SurfaceSource;
  let surfaceT: number;
  let fRsi: number | undefined;
  if (!isAbsent(input.surfaceTemperatureC)) {
    source = "measured";
    surfaceT = requireTemperatureC(input.surfaceTemperatureC, "surface temperature");
    if (outdoorT !== undefined) {
      fRsi = measuredTemperatureFactor(surfaceT, airT, outdoorT);
      if (fRsi === undefined) {
        reasons.push(
          `Indoors (${celsius(airT)}) is less than ${MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K} K warmer than outdoors ` +
            `(${celsius(outdoorT)}), too little to judge how cold the surface runs, so no temperature factor is given.`,
        );
      }
    }
  } else if (element && outdoorT !== undefined) {
    source = "estimated";
    fRsi = element.fRsi;
    surfaceT = outdoorT + fRsi * (airT - outdoorT);
    reasons.push(estimatedReason(element, surfaceT, outdoorT, airT));
  } else {
    source = "air";
    surfaceT = airT;
    reasons.push(
      element
        ? `An outdoor temperature is needed to estimate the surface temperature for ${element.phrase}, ` +
            `so the surface is taken at the air temperature of ${celsius(airT)}; the real surface is likely colder.`
        : `No surface temperature or building element was given, so the surface is taken at the air temperature ` +
            `of ${celsius(airT)}; a real wall or window is usually colder.`,
    );
  }

  // A surface at or below 0.01 °C is judged over ice (ISO 13788); above, the air's own RH where it is at the air temperature.
  const iced = surfaceT <= TRIPLE_POINT_C;
  const surfaceRh = source === "air" && !iced ? rh : (100 * pv) / psatSurfacePa(surfaceT);
  let state = surfaceState(surfaceRh);
  if (source === "air" && state === "condensing") {
    // Without a surface temperature (measured or estimated from the construction) the surface is only
    // assumed to be at the air temperature: saturated air says mould risk, not that water condenses there.
    state = "mould-risk";
    reasons.push(
      `The air is saturated${iced ? " relative to ice" : ""} (${percent(rh)} relative humidity). Without a surface temperature we cannot say whether water ` +
        `condenses on the surface, but any surface colder than the air would be wet.`,
    );
  } else {
    reasons.push(stateReason(state, noun, surfaceT, surfaceRh, dewPoint, iced ? frostPoint : null));
  }

  if (fRsi !== undefined && fRsi < CRITICAL_TEMPERATURE_FACTOR) {
    reasons.push(
      source === "measured"
        ? `The surface's temperature factor is ${factor(fRsi)}, below the ${CRITICAL_TEMPERATURE_FACTOR} that ` +
            `BRE IP 1/06 sets for homes: it is colder than it should be for the outdoor temperature.`
        : `The typical temperature factor for ${element?.phrase ?? "this element"}, ${factor(fRsi)}, is below the ` +
            `${CRITICAL_TEMPERATURE_FACTOR} that BRE IP 1/06 sets for homes, so it runs cold in cold weather.`,
    );
  }

  const surface: SurfaceResult =
    fRsi === undefined
      ? { temperatureC: surfaceT, source, relativeHumidityPct: surfaceRh, state }
      : { temperatureC: surfaceT, source, relativeHumidityPct: surfaceRh, temperatureFactor: fRsi, state };

  return {
    dewPointC: dewPoint,
    frostPointC: frostPoint,
    vapourPressurePa: pv,
    saturationVapourPressurePa: psatAir,
    absoluteHumidityGPerM3: (1000 * pv) / (GAS_CONSTANT_WATER_VAPOUR * (airT + 273.15)),
    humidityRatio: psychrolib.GetHumRatioFromVapPres(pv, pressure),
    surface,
    reasons,
  };
}

function estimatedReason(element: BuildingElement, surfaceT: number, outdoorT: number, airT: number): string {
  const base =
    `The ${element.surfaceNoun} surface is estimated at ${celsius(surfaceT)} from the air at ${celsius(airT)} and ` +
    `the outdoor temperature of ${celsius(outdoorT)}, using a typical temperature factor of ${factor(element.fRsi)} ` +
    `for ${element.phrase}.`;
  return element.id === "corner-thermal-bridge"
    ? `${base} The corner is taken as colder than the plain wall (0.475); that figure is our own assumption, not a measurement.`
    : base;
}

const ICE_NOTE = "below 0 °C a surface is judged against saturation over ice, as ISO 13788 does";

/** frostPoint is given only for a surface at or below 0.01 °C whose air has one: it is then the mark. */
function stateReason(
  state: SurfaceState,
  noun: string,
  surfaceT: number,
  surfaceRh: number,
  dewPoint: number,
  frostPoint: number | null,
): string {
  const iced = surfaceT <= TRIPLE_POINT_C;
  switch (state) {
    case "condensing": {
      if (frostPoint !== null) {
        const relation = surfaceT > frostPoint - 0.05 ? "at" : "below";
        return `${noun} is about ${celsius(surfaceT)}, ${relation} the air's frost point of ${celsius(frostPoint)}, so frost forms on it (${ICE_NOTE}).`;
      }
      const relation = surfaceT > dewPoint - 0.05 ? "at" : "below";
      return `${noun} is about ${celsius(surfaceT)}, ${relation} the air's dew point of ${celsius(dewPoint)}, so water condenses on it${iced ? " and freezes" : ""}.`;
    }
    case "mould-risk":
      return (
        `${noun} is about ${celsius(surfaceT)}; the moisture in the air gives it a relative humidity of ${percent(surfaceRh)}${iced ? ` (relative to ice: ${ICE_NOTE})` : ""}, ` +
        `at or above the ${MOULD_SURFACE_RH_PCT} % at which mould can grow if it lasts (ISO 13788 judges this on a monthly mean).`
      );
    case "borderline":
      return (
        `${noun} is about ${celsius(surfaceT)}, with a relative humidity of ${percent(surfaceRh)}${iced ? ` (relative to ice: ${ICE_NOTE})` : ""}: close to the ` +
        `${MOULD_SURFACE_RH_PCT} % at which mould can grow (the ${BORDERLINE_SURFACE_RH_PCT} % warning level is our own).`
      );
    case "dry": {
      const mark = frostPoint ?? dewPoint;
      return (
        `${noun} is about ${celsius(surfaceT)}, with a relative humidity of ${percent(surfaceRh)}${iced ? " (relative to ice)" : ""}, ` +
        `${fixed(surfaceT - mark, 1)} K above the ${frostPoint === null ? "dew" : "frost"} point: below the levels at which mould grows or water condenses.`
      );
    }
  }
}
