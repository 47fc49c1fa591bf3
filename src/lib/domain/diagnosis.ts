// What the readings point to, in plain words. This judges the building and its conditions,
// never the people living there. It says nothing about whether to investigate a report: every
// report is investigated whatever the readings show, and that is the caller's business.
import { ASSUMED_OUTDOOR_RH_PCT, HIGH_MOISTURE_LOAD_CLASS } from "./moisture-load.js";
import { CRITICAL_TEMPERATURE_FACTOR, MOULD_SURFACE_RH_PCT, BORDERLINE_SURFACE_RH_PCT } from "./surface.js";
import { celsius, factor, fixed, hours, percent } from "./wording.js";

export type DiagnosisKind =
  "ventilation-or-moisture-load" | "cold-surface" | "likely-not-condensation" | "no-risk-found" | "insufficient-data";

export interface Diagnosis {
  kind: DiagnosisKind;
  reasons: string[];
}

/** Our own minimum: one full day of readings, so a daily heating and occupancy cycle is seen. */
export const MIN_OBSERVED_HOURS = 24;

/**
 * Our own threshold (common practice, no source): a mean room RH of 60 % or more is high. At
 * 20 °C in and 0 °C out, 60 % already needs a temperature factor of 0.77 (ISO 13788 worked
 * example), above the 0.75 a sound home must reach, so such air puts even sound surfaces at risk.
 */
export const HIGH_AIR_RH_PCT = 60;

/**
 * A room averaging under 18 °C is called cool in the reasons. 18 °C is the minimum indoor
 * temperature for cold seasons in the WHO Housing and health guidelines (2018) — from memory.
 */
export const COOL_ROOM_C = 18;

export interface DiagnosisFacts {
  /** Hours covered by readings (gaps excluded). */
  observedHours: number;
  /** Dampness or water seen on the surface (an inspection or tenant observation). */
  surfaceWet?: boolean;
  worstRolling30DayMeanSurfaceRhPct: number | null;
  hoursSurfaceRhAtLeast80: number;
  hoursCondensing: number;
  meanAirRelativeHumidityPct?: number;
  meanAirTemperatureC?: number;
  /** Measured from surface, indoor and outdoor temperatures, or the element's typical value. */
  temperatureFactor?: { value: number; basis: "measured" | "estimated" };
  moistureExcess?: {
    meanGPerM3: number;
    loadClass: number;
    meanOutdoorTemperatureC: number;
    /** Readings with an outdoor temperature, and how many of them had no outdoor RH. */
    readings: number;
    assumedOutdoorRhReadings: number;
  };
  /** How the surface temperature was obtained, by number of readings. */
  surfaceSources?: { measured: number; estimated: number; air: number };
}

export function diagnose(facts: DiagnosisFacts): Diagnosis {
  const reasons: string[] = [];
  const worst = facts.worstRolling30DayMeanSurfaceRhPct;

  if (!(facts.observedHours >= MIN_OBSERVED_HOURS) || worst === null) {
    reasons.push(
      `The readings cover ${hours(Math.max(0, facts.observedHours))} hours; at least ${MIN_OBSERVED_HOURS} hours ` +
        `of readings are needed to judge the conditions at the surface.`,
    );
    if (facts.surfaceWet) {
      reasons.push(
        "Dampness was seen on the surface; longer readings would show whether it comes from condensation or from water getting in.",
      );
    }
    return { kind: "insufficient-data", reasons };
  }

  const atRisk = worst >= MOULD_SURFACE_RH_PCT || facts.hoursCondensing > 0;
  const surfaceNote = surfaceSourceNote(facts.surfaceSources);
  const assumedNote = assumedOutdoorRhNote(facts.moistureExcess);

  if (!atRisk) {
    if (facts.surfaceWet) {
      reasons.push(
        `Dampness was seen on the surface, but the readings never showed it at the dew point, and its worst 30-day mean ` +
          `relative humidity was ${percent(worst)}, below the ${MOULD_SURFACE_RH_PCT} % at which mould grows.`,
        "Water from a leak, or penetrating or rising damp, can wet a surface without condensation: a survey is needed to find the source.",
      );
      if (surfaceNote) reasons.push(surfaceNote);
      return { kind: "likely-not-condensation", reasons };
    }
    reasons.push(
      `The worst 30-day mean relative humidity at the surface was ${percent(worst)}, below the ${MOULD_SURFACE_RH_PCT} % ` +
        `at which mould can grow (ISO 13788), and the surface never reached the dew point.`,
    );
    if (worst >= BORDERLINE_SURFACE_RH_PCT) {
      reasons.push(`That is close to ${MOULD_SURFACE_RH_PCT} %, so the surface is worth watching.`);
    }
    if (facts.hoursSurfaceRhAtLeast80 > 0) {
      reasons.push(
        `The surface was at ${MOULD_SURFACE_RH_PCT} % or more for ${hours(facts.hoursSurfaceRhAtLeast80)} hours, ` +
          `not long enough to lift the monthly mean to that level.`,
      );
    }
    if (surfaceNote) reasons.push(surfaceNote);
    return { kind: "no-risk-found", reasons };
  }

  const condensing =
    facts.hoursCondensing > 0
      ? `at the dew point, so wet with condensation, for ${hours(facts.hoursCondensing)} hours`
      : "never at the dew point";
  reasons.push(
    `The surface was at ${MOULD_SURFACE_RH_PCT} % relative humidity or more for ${hours(facts.hoursSurfaceRhAtLeast80)} hours ` +
      `and ${condensing}; its worst 30-day mean was ${percent(worst)} ` +
      `(ISO 13788 takes ${MOULD_SURFACE_RH_PCT} % as the limit for mould).`,
  );

  const excess = facts.moistureExcess;
  const tf = facts.temperatureFactor;
  const cold = tf !== undefined && tf.value < CRITICAL_TEMPERATURE_FACTOR;
  const airRh = facts.meanAirRelativeHumidityPct;
  let kind: DiagnosisKind;

  if (excess && excess.loadClass >= HIGH_MOISTURE_LOAD_CLASS) {
    kind = "ventilation-or-moisture-load";
    reasons.push(
      `The air indoors held on average ${fixed(excess.meanGPerM3, 1)} g/m³ more water than the air outside ` +
        `(mean outdoor temperature ${celsius(excess.meanOutdoorTemperatureC)}): moisture load class ${excess.loadClass} of 5 ` +
        `(ISO 13788). Moisture in the air is high for the ventilation the room has.`,
    );
    if (cold && tf) reasons.push(temperatureFactorReason(tf, "also"));
  } else if (excess || cold || (airRh !== undefined && airRh < HIGH_AIR_RH_PCT)) {
    kind = "cold-surface";
    if (excess) {
      reasons.push(
        `The air indoors held on average ${fixed(excess.meanGPerM3, 1)} g/m³ more water than the air outside ` +
          `(mean outdoor temperature ${celsius(excess.meanOutdoorTemperatureC)}): moisture load class ${excess.loadClass} of 5 ` +
          `(ISO 13788), within the usual range for a home.`,
      );
    } else if (airRh !== undefined && !cold) {
      reasons.push(
        `The room air averaged ${percent(airRh)} relative humidity, which is moderate, while the surface reached ` +
          `mould-growth levels: the surface is much colder than the air.`,
      );
    }
    if (tf) {
      reasons.push(
        cold
          ? temperatureFactorReason(tf, "")
          : `The temperature factor of ${factor(tf.value)} meets the ${CRITICAL_TEMPERATURE_FACTOR} of BRE IP 1/06, so the ` +
              `surface is not unusually cold for the weather; a cool room or a colder spot nearby may be the cause.`,
      );
    }
    reasons.push(
      "A cold surface points to missing or poor insulation, a thermal bridge, or a heating system that does not keep the room warm enough.",
    );
  } else {
    kind = "ventilation-or-moisture-load";
    if (airRh !== undefined) {
      reasons.push(
        `The room air averaged ${percent(airRh)} relative humidity: moisture in the air is high for the ventilation the room has.`,
      );
    }
    reasons.push(
      "Outdoor temperature readings would confirm this by showing how much more water the air indoors holds than the air outside.",
    );
  }

  if (facts.meanAirTemperatureC !== undefined && facts.meanAirTemperatureC < COOL_ROOM_C) {
    reasons.push(
      `The room air averaged ${celsius(facts.meanAirTemperatureC)}; a cooler room has cooler walls and windows, ` +
        "and the same moisture gives a higher relative humidity.",
    );
  }
  if (facts.surfaceWet) reasons.push("The dampness seen on the surface fits these readings.");
  if (surfaceNote) reasons.push(surfaceNote);
  if (assumedNote) reasons.push(assumedNote);
  return { kind, reasons };
}

function temperatureFactorReason(tf: { value: number; basis: "measured" | "estimated" }, also: "also" | ""): string {
  const which = tf.basis === "measured" ? "measured" : "typical";
  return (
    `The surface is ${also ? "also " : ""}colder than it should be: its ${which} temperature factor is ${factor(tf.value)}, ` +
    `below the ${CRITICAL_TEMPERATURE_FACTOR} that BRE IP 1/06 sets for homes.`
  );
}

function surfaceSourceNote(sources: DiagnosisFacts["surfaceSources"]): string | undefined {
  if (!sources) return undefined;
  const total = sources.measured + sources.estimated + sources.air;
  if (total === 0 || sources.measured === total) return undefined;
  if (sources.air === total) {
    return (
      "No surface temperature was measured or estimated, so the surface was taken at the air temperature; " +
      "a real wall or window is usually colder and may be at more risk than shown."
    );
  }
  if (sources.estimated === total) {
    return (
      "The surface temperature was estimated from a typical building element, not measured; " +
      "measured surface temperatures would make this firmer."
    );
  }
  const parts = [
    sources.measured > 0 ? `measured for ${sources.measured}` : "",
    sources.estimated > 0 ? `estimated from a typical building element for ${sources.estimated}` : "",
    sources.air > 0 ? `taken at the air temperature for ${sources.air}` : "",
  ].filter((part) => part !== "");
  return (
    `Of ${total} readings, the surface temperature was ${parts.join(", ")}; ` +
    "measured surface temperatures would make this firmer."
  );
}

function assumedOutdoorRhNote(excess: DiagnosisFacts["moistureExcess"]): string | undefined {
  if (!excess || excess.assumedOutdoorRhReadings === 0) return undefined;
  if (excess.assumedOutdoorRhReadings === excess.readings) {
    return (
      `Outdoor humidity was not measured; it was taken as ${ASSUMED_OUTDOOR_RH_PCT} % relative humidity, ` +
      "a usual winter value."
    );
  }
  return (
    `Outdoor humidity was not measured for ${excess.assumedOutdoorRhReadings} of the ${excess.readings} readings with ` +
    `an outdoor temperature; it was taken as ${ASSUMED_OUTDOOR_RH_PCT} % relative humidity, a usual winter value.`
  );
}
