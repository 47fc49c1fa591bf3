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
  BUILDING_ELEMENTS,
  BORDERLINE_SURFACE_RH_PCT,
  CRITICAL_TEMPERATURE_FACTOR,
  MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K,
  MOULD_SURFACE_RH_PCT,
  getBuildingElement,
  surfaceState,
  temperatureFactor as measuredTemperatureFactor,
  type ElementId,
  type SurfaceState,
} from "./surface.js";
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
  /** The reasons in English (staff screens, the API, e-mails and the evidence pack). */
  reasons: string[];
  /** The same reasons by id with their figures, for a screen that says them in the reader's language. */
  reasonIds: PointReason[];
}

/** Ids a reason's sentence is built from; `noun` and `element` name words a screen translates too. */
export const POINT_REASON_IDS = [
  "no-factor",
  "estimated",
  "air-element",
  "air-none",
  "saturated",
  "frost",
  "dew",
  "mould-risk",
  "borderline",
  "dry",
  "factor-measured",
  "factor-typical",
] as const;
export type PointReasonId = (typeof POINT_REASON_IDS)[number];

/**
 * One reason: its id and values. Numbers are rounded as they are shown (half up, wording.ts); strings are
 * ids: `noun` (window, wall, corner or none), `element` (an ElementId or "none"), and the selectors
 * `relation` (at, below), `ice` and `corner` (yes, no) and `mark` (dew, frost).
 */
export interface PointReason {
  id: PointReasonId;
  values: Record<string, number | string>;
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
  const reasonIds: PointReason[] = [];
  const say = (id: PointReasonId, values: PointReason["values"]) => reasonIds.push({ id, values });
  const noun = element ? element.surfaceNoun : "none";

  let source: SurfaceSource;
  let surfaceT: number;
  let fRsi: number | undefined;
  if (!isAbsent(input.surfaceTemperatureC)) {
    source = "measured";
    surfaceT = requireTemperatureC(input.surfaceTemperatureC, "surface temperature");
    if (outdoorT !== undefined) {
      fRsi = measuredTemperatureFactor(surfaceT, airT, outdoorT);
      if (fRsi === undefined) {
        say("no-factor", { air: c1(airT), outdoor: c1(outdoorT), minDifference: MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K });
      }
    }
  } else if (element && outdoorT !== undefined) {
    source = "estimated";
    fRsi = element.fRsi;
    surfaceT = outdoorT + fRsi * (airT - outdoorT);
    say("estimated", {
      noun,
      element: element.id,
      surface: c1(surfaceT),
      air: c1(airT),
      outdoor: c1(outdoorT),
      factor: Number(factor(element.fRsi)),
      corner: element.id === "corner-thermal-bridge" ? "yes" : "no",
    });
  } else {
    source = "air";
    surfaceT = airT;
    if (element) say("air-element", { element: element.id, air: c1(airT) });
    else say("air-none", { air: c1(airT) });
  }

  // A surface at or below 0.01 °C is judged over ice (ISO 13788); above, the air's own RH where it is at the air temperature.
  const iced = surfaceT <= TRIPLE_POINT_C;
  const surfaceRh = source === "air" && !iced ? rh : (100 * pv) / psatSurfacePa(surfaceT);
  let state = surfaceState(surfaceRh);
  if (source === "air" && state === "condensing") {
    // Without a surface temperature (measured or estimated from the construction) the surface is only
    // assumed to be at the air temperature: saturated air says mould risk, not that water condenses there.
    state = "mould-risk";
    say("saturated", { ice: iced ? "yes" : "no", rh: Number(fixed(rh, 0)) });
  } else {
    reasonIds.push(stateReason(state, noun, surfaceT, surfaceRh, dewPoint, iced ? frostPoint : null));
  }

  if (fRsi !== undefined && fRsi < CRITICAL_TEMPERATURE_FACTOR) {
    if (source === "measured") say("factor-measured", { factor: Number(factor(fRsi)), critical: CRITICAL_TEMPERATURE_FACTOR });
    else
      say("factor-typical", {
        element: element?.id ?? "none",
        factor: Number(factor(fRsi)),
        critical: CRITICAL_TEMPERATURE_FACTOR,
      });
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
    reasons: reasonIds.map(reasonInEnglish),
    reasonIds,
  };
}

/** A temperature as shown: rounded half up to 0.1 °C. */
const c1 = (value: number) => Number(fixed(value, 1));

const ICE_NOTE = "below 0 °C a surface is judged against saturation over ice, as ISO 13788 does";

/** frostPoint is given only for a surface at or below 0.01 °C whose air has one: it is then the mark. */
function stateReason(
  state: SurfaceState,
  noun: string,
  surfaceT: number,
  surfaceRh: number,
  dewPoint: number,
  frostPoint: number | null,
): PointReason {
  const ice = surfaceT <= TRIPLE_POINT_C ? "yes" : "no";
  const base = { noun, surface: c1(surfaceT) };
  switch (state) {
    case "condensing": {
      if (frostPoint !== null) {
        const relation = surfaceT > frostPoint - 0.05 ? "at" : "below";
        return { id: "frost", values: { ...base, relation, frost: c1(frostPoint) } };
      }
      const relation = surfaceT > dewPoint - 0.05 ? "at" : "below";
      return { id: "dew", values: { ...base, relation, dew: c1(dewPoint), ice } };
    }
    case "mould-risk":
      return { id: "mould-risk", values: { ...base, ice, rh: Number(fixed(surfaceRh, 0)), mould: MOULD_SURFACE_RH_PCT } };
    case "borderline":
      return {
        id: "borderline",
        values: {
          ...base,
          ice,
          rh: Number(fixed(surfaceRh, 0)),
          mould: MOULD_SURFACE_RH_PCT,
          borderline: BORDERLINE_SURFACE_RH_PCT,
        },
      };
    case "dry": {
      const mark = frostPoint ?? dewPoint;
      return {
        id: "dry",
        values: {
          ...base,
          ice,
          rh: Number(fixed(surfaceRh, 0)),
          gap: Number(fixed(surfaceT - mark, 1)),
          mark: frostPoint === null ? "dew" : "frost",
        },
      };
    }
  }
}

// ---- The reasons in English --------------------------------------------------------------------
// The same words as the risk namespace's en-GB messages (reason.*), which tenant screens use in the
// reader's language; tests/client/risk-reasons.test.tsx checks the two agree.

const subjectOf = (noun: string | number | undefined) =>
  noun === "window" || noun === "wall" || noun === "corner" ? `The ${noun} surface` : "The surface";
const phraseOf = (element: string | number | undefined) => {
  const found = BUILDING_ELEMENTS.find((e) => e.id === element);
  return found ? found.phrase : "this element";
};

/** One reason in English (staff screens, the API, e-mails and the evidence pack). */
export function reasonInEnglish({ id, values: v }: PointReason): string {
  const n = (key: string) => Number(v[key]);
  const deg = (key: string) => celsius(n(key));
  const ice = v.ice === "yes";
  switch (id) {
    case "no-factor":
      return (
        `Indoors (${deg("air")}) is less than ${n("minDifference")} K warmer than outdoors ` +
        `(${deg("outdoor")}), too little to judge how cold the surface runs, so no temperature factor is given.`
      );
    case "estimated": {
      const base =
        `${subjectOf(v.noun)} is estimated at ${deg("surface")} from the air at ${deg("air")} and ` +
        `the outdoor temperature of ${deg("outdoor")}, using a typical temperature factor of ${factor(n("factor"))} ` +
        `for ${phraseOf(v.element)}.`;
      return v.corner === "yes"
        ? `${base} The corner is taken as colder than the plain wall (0.475); that figure is our own assumption, not a measurement.`
        : base;
    }
    case "air-element":
      return (
        `An outdoor temperature is needed to estimate the surface temperature for ${phraseOf(v.element)}, ` +
        `so the surface is taken at the air temperature of ${deg("air")}; the real surface is likely colder.`
      );
    case "air-none":
      return (
        `No surface temperature or building element was given, so the surface is taken at the air temperature ` +
        `of ${deg("air")}; a real wall or window is usually colder.`
      );
    case "saturated":
      return (
        `The air is saturated${ice ? " relative to ice" : ""} (${percent(n("rh"))} relative humidity). Without a surface temperature we cannot say whether water ` +
        `condenses on the surface, but any surface colder than the air would be wet.`
      );
    case "frost":
      return `${subjectOf(v.noun)} is about ${deg("surface")}, ${v.relation === "at" ? "at" : "below"} the air's frost point of ${deg("frost")}, so frost forms on it (${ICE_NOTE}).`;
    case "dew":
      return `${subjectOf(v.noun)} is about ${deg("surface")}, ${v.relation === "at" ? "at" : "below"} the air's dew point of ${deg("dew")}, so water condenses on it${ice ? " and freezes" : ""}.`;
    case "mould-risk":
      return (
        `${subjectOf(v.noun)} is about ${deg("surface")}; the moisture in the air gives it a relative humidity of ${percent(n("rh"))}${ice ? ` (relative to ice: ${ICE_NOTE})` : ""}, ` +
        `at or above the ${n("mould")} % at which mould can grow if it lasts (ISO 13788 judges this on a monthly mean).`
      );
    case "borderline":
      return (
        `${subjectOf(v.noun)} is about ${deg("surface")}, with a relative humidity of ${percent(n("rh"))}${ice ? ` (relative to ice: ${ICE_NOTE})` : ""}: close to the ` +
        `${n("mould")} % at which mould can grow (the ${n("borderline")} % warning level is our own).`
      );
    case "dry":
      return (
        `${subjectOf(v.noun)} is about ${deg("surface")}, with a relative humidity of ${percent(n("rh"))}${ice ? " (relative to ice)" : ""}, ` +
        `${fixed(n("gap"), 1)} K above the ${v.mark === "frost" ? "frost" : "dew"} point: below the levels at which mould grows or water condenses.`
      );
    case "factor-measured":
      return (
        `The surface's temperature factor is ${factor(n("factor"))}, below the ${n("critical")} that ` +
        `BRE IP 1/06 sets for homes: it is colder than it should be for the outdoor temperature.`
      );
    case "factor-typical":
      return (
        `The typical temperature factor for ${phraseOf(v.element)}, ${factor(n("factor"))}, is below the ` +
        `${n("critical")} that BRE IP 1/06 sets for homes, so it runs cold in cold weather.`
      );
  }
}
