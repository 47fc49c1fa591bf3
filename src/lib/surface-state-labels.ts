// Plain words for the four surface states of the risk engine, shared by every view that shows one.
import type { SurfaceSource } from "./domain/point.js";
import { BORDERLINE_SURFACE_RH_PCT, MOULD_SURFACE_RH_PCT, type SurfaceState } from "./domain/surface.js";

export interface StateLabel {
  /** The badge text. */
  label: string;
  /** One sentence for the badge line and for screen-reader summaries. */
  summary: string;
  /** What the state means, a little longer. */
  explanation: string;
}

export const STATE_LABELS: Record<SurfaceState, StateLabel> = {
  condensing: {
    label: "Condensing",
    summary: "Water is condensing on the surface.",
    explanation:
      "The surface is at or below the dew point of the air, so water vapour from the room turns into droplets or a wet film on it. " +
      "Surfaces that stay wet like this are where mould takes hold.",
  },
  "mould-risk": {
    label: "Mould risk",
    summary: "The surface is damp enough for mould to grow.",
    explanation:
      `The air touching the surface is at ${MOULD_SURFACE_RH_PCT} % relative humidity or more. ISO 13788 uses ${MOULD_SURFACE_RH_PCT} % as the level ` +
      "at which mould can grow when it lasts: it judges the average over a month, so one reading is an early sign rather than a verdict.",
  },
  borderline: {
    label: "Borderline",
    // The 70–80 % band is our own early warning; ISO 13788 sets only the 80 %.
    summary: "The surface is close to the level at which mould can grow.",
    explanation:
      `The air touching the surface is between ${BORDERLINE_SURFACE_RH_PCT} % and ${MOULD_SURFACE_RH_PCT} % relative humidity: below the ` +
      `${MOULD_SURFACE_RH_PCT} % at which mould can grow, but not far off. This ${BORDERLINE_SURFACE_RH_PCT}–${MOULD_SURFACE_RH_PCT} % margin is ` +
      "Dewline's own choice, not part of a standard: a slightly colder surface or damper air would tip it over.",
  },
  dry: {
    label: "Dry",
    summary: "The surface is below the levels for mould and condensation.",
    explanation:
      `The air touching the surface is below ${BORDERLINE_SURFACE_RH_PCT} % relative humidity, too dry for mould or condensation at the ` +
      "moment of this reading. Conditions change through the day and the seasons, so one reading is a snapshot.",
  },
};

/**
 * Where the surface temperature came from, in words. "air" also covers an outdoor temperature
 * without an element (or the reverse): the engine needs both to estimate a surface.
 */
export const SURFACE_SOURCE_LABELS: Record<SurfaceSource, string> = {
  measured: "measured",
  estimated: "estimated from the outdoor temperature and the element",
  air: "taken at air temperature: no surface temperature given, and no element with an outdoor temperature to estimate one",
};
