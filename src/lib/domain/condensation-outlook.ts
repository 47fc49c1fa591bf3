// The tenant's three-day condensation outlook: for each room, from an hourly outdoor forecast, the
// room's indoor conditions and the home's coldest surface, the estimated surface temperature and
// surface relative humidity hour by hour, counted per London day and put in plain words.
//
// Method: ISO 13788's surface temperature θsi = θe + fRsi·(θi − θe) (surface.ts) and the surface
// relative humidity 100·pi/psat(θsi) with pi from the room's air (surface.ts, psychrometrics.ts).
// Assumptions (ours, stated to the reader):
// - the room's air temperature and humidity hold at the figures used for all three days;
// - with no recent readings, a room is taken at ASSUMED_INDOOR (18 °C, 60 % in the heating season);
// - every room has the home's coldest surface (the walls and windows are recorded per home, not room).
import { ZoneConverter, DEFAULT_TIME_ZONE } from "./time-zone.js";
import { glazingElement, wallElement, type GlazingKind, type WallKind } from "./home-elements.js";
import { vapourPressurePa } from "./psychrometrics.js";
import {
  CONDENSATION_SURFACE_RH_PCT,
  CRITICAL_TEMPERATURE_FACTOR,
  MOULD_SURFACE_RH_PCT,
  estimateSurfaceTemperatureC,
  getBuildingElement,
  surfaceRelativeHumidityPct,
  type BuildingElement,
} from "./surface.js";

/** How many London days the outlook covers: today (from the current hour) and the two after it. */
export const OUTLOOK_DAYS = 3;

/**
 * Our own levels, from the counts of one day on the coldest surface (no standard sets them):
 * "likely" with LIKELY_CONDENSING_HOURS or more hours at or above 100 %; "possible" with any hour
 * condensing or POSSIBLE_HOURS_AT_80 or more hours at or above 80 % (ISO 13788's mould threshold);
 * otherwise "unlikely". A day without forecast hours has no level.
 */
export const LIKELY_CONDENSING_HOURS = 2;
export const POSSIBLE_HOURS_AT_80 = 4;

/** Our own: below this outdoor temperature (°C) within the outlook, the steady-heating tip is given. */
export const COLD_SPELL_OUTDOOR_C = 5;

export const OUTLOOK_LEVELS = ["unlikely", "possible", "likely"] as const;
export type OutlookLevel = (typeof OUTLOOK_LEVELS)[number];

export type IndoorSource = "sensor" | "case-readings" | "assumed";

export interface OutdoorForecastHour {
  at: Date;
  temperatureC: number;
  relativeHumidityPct: number;
}

export interface IndoorConditions {
  airTemperatureC: number;
  relativeHumidityPct: number;
  source: IndoorSource;
  /** When the readings were taken; null for an assumption. */
  takenAt: Date | null;
}

/**
 * Our own assumption for a room with no recent readings (no source): 18 °C and 60 % RH in the
 * heating season (October to April, by the London month), 20 °C and 60 % RH otherwise.
 */
export function assumedIndoorConditions(now: Date, timeZone: string = DEFAULT_TIME_ZONE): IndoorConditions {
  const month = Number(localDate(now, new ZoneConverter(timeZone)).slice(5, 7));
  const heatingSeason = month >= 10 || month <= 4;
  return { airTemperatureC: heatingSeason ? 18 : 20, relativeHumidityPct: 60, source: "assumed", takenAt: null };
}

/**
 * The home's coldest surface among its windows, its walls and (for a solid wall) an external
 * corner of it: the lowest temperature factor, so the surface where water settles first.
 */
export function coldestSurface(home: { glazingType: GlazingKind; wallType: WallKind }): BuildingElement {
  const wall = wallElement(home.wallType);
  const candidates = [getBuildingElement(glazingElement(home.glazingType)), getBuildingElement(wall)];
  if (wall === "solid-wall") candidates.push(getBuildingElement("corner-thermal-bridge"));
  return candidates.reduce((a, b) => (b.fRsi < a.fRsi ? b : a));
}

export interface OutlookHour {
  at: Date;
  outdoorTemperatureC: number;
  surfaceTemperatureC: number;
  /** The raw ratio: above 100 the surface is below the air's dew point. */
  surfaceRelativeHumidityPct: number;
}

export interface OutlookDay {
  /** The London date, YYYY-MM-DD. */
  date: string;
  /** Forecast hours counted (today's start at the current hour). */
  hours: number;
  hoursAtOrAbove80: number;
  condensingHours: number;
  coldestSurfaceTemperatureC: number | null;
  highestSurfaceRelativeHumidityPct: number | null;
  lowestOutdoorTemperatureC: number | null;
  /** null when the day has no forecast hours. */
  level: OutlookLevel | null;
}

export interface RoomOutlook {
  days: OutlookDay[];
  hours: OutlookHour[];
}

export interface RoomOutlookInput {
  now: Date;
  timeZone?: string;
  forecast: readonly OutdoorForecastHour[];
  indoor: IndoorConditions;
  /** Temperature factor of the surface judged (the home's coldest). */
  fRsi: number;
}

/** The London dates of the outlook: today and the OUTLOOK_DAYS − 1 after it. */
export function outlookDates(now: Date, timeZone: string = DEFAULT_TIME_ZONE): string[] {
  const today = localDate(now, new ZoneConverter(timeZone));
  const base = Date.parse(`${today}T00:00:00Z`);
  return Array.from({ length: OUTLOOK_DAYS }, (_, i) => new Date(base + i * 86_400_000).toISOString().slice(0, 10));
}

/** The instants the outlook needs forecast hours for: from the current hour to the London midnight ending its last day. */
export function outlookWindow(now: Date, timeZone: string = DEFAULT_TIME_ZONE): { from: Date; to: Date } {
  const zone = new ZoneConverter(timeZone);
  const last = outlookDates(now, timeZone).at(-1)!;
  const end = zone.toUtc(Date.parse(`${last}T00:00:00Z`) + 86_400_000);
  return { from: new Date(Math.floor(now.getTime() / 3_600_000) * 3_600_000), to: new Date(end) };
}

export function levelFor(day: { hours: number; hoursAtOrAbove80: number; condensingHours: number }): OutlookLevel | null {
  if (day.hours === 0) return null;
  if (day.condensingHours >= LIKELY_CONDENSING_HOURS) return "likely";
  if (day.condensingHours > 0 || day.hoursAtOrAbove80 >= POSSIBLE_HOURS_AT_80) return "possible";
  return "unlikely";
}

/** One room over the outlook's days; forecast hours before the current hour or after the last day are left out. */
export function roomOutlook(input: RoomOutlookInput): RoomOutlook {
  const zone = new ZoneConverter(input.timeZone ?? DEFAULT_TIME_ZONE);
  const dates = outlookDates(input.now, zone.timeZone);
  const fromMs = Math.floor(input.now.getTime() / 3_600_000) * 3_600_000;
  const pi = vapourPressurePa(input.indoor.airTemperatureC, input.indoor.relativeHumidityPct);
  const byDate = new Map<string, OutlookHour[]>(dates.map((d) => [d, []]));
  const hours: OutlookHour[] = [];
  const seen = new Set<number>();
  for (const f of [...input.forecast].sort((a, b) => a.at.getTime() - b.at.getTime())) {
    const ms = f.at.getTime();
    if (ms < fromMs || seen.has(ms)) continue;
    const day = byDate.get(localDate(f.at, zone));
    if (!day) continue;
    seen.add(ms);
    const surfaceTemperatureC = estimateSurfaceTemperatureC(input.fRsi, input.indoor.airTemperatureC, f.temperatureC);
    const hour: OutlookHour = {
      at: f.at,
      outdoorTemperatureC: f.temperatureC,
      surfaceTemperatureC,
      surfaceRelativeHumidityPct: surfaceRelativeHumidityPct(pi, surfaceTemperatureC),
    };
    day.push(hour);
    hours.push(hour);
  }
  const days = dates.map((date): OutlookDay => {
    const h = byDate.get(date) ?? [];
    const counts = {
      hours: h.length,
      hoursAtOrAbove80: h.filter((x) => x.surfaceRelativeHumidityPct >= MOULD_SURFACE_RH_PCT).length,
      condensingHours: h.filter((x) => x.surfaceRelativeHumidityPct >= CONDENSATION_SURFACE_RH_PCT).length,
    };
    return {
      date,
      ...counts,
      coldestSurfaceTemperatureC: h.length ? Math.min(...h.map((x) => x.surfaceTemperatureC)) : null,
      highestSurfaceRelativeHumidityPct: h.length ? Math.max(...h.map((x) => x.surfaceRelativeHumidityPct)) : null,
      lowestOutdoorTemperatureC: h.length ? Math.min(...h.map((x) => x.outdoorTemperatureC)) : null,
      level: levelFor(counts),
    };
  });
  return { days, hours };
}

// ---- Tips and cautions ------------------------------------------------------------------------

export const NO_SOURCE = "common practice, no source";

/** The ids of the sources behind the advice, so a screen can say each in the reader's language. */
export const ADVICE_BASES = {
  "common-practice": NO_SOURCE,
  "gas-safety": "from memory (gas safety and carbon monoxide guidance)",
  "damp-health-guidance": "from memory (UK government guidance on the health risks of damp and mould, 2023)",
} as const;
export type AdviceBasisId = keyof typeof ADVICE_BASES;

/**
 * One tip, caution or method line. `text` is the English (staff screens, e-mails, the API); a tenant
 * screen says it by `id` in the reader's language, with `values` (the figures in it) as ICU arguments.
 */
export interface OutlookLine {
  id: string;
  text: string;
  values: Record<string, number>;
}

export interface OutlookAdvice extends OutlookLine {
  /** Where the advice comes from: a named source, "from memory", or NO_SOURCE. */
  basis: string;
  basisId: AdviceBasisId;
}

const COMMON = { basis: NO_SOURCE, basisId: "common-practice" } as const;

/** Ours (common practice): how long fans run after cooking or a shower, and the gap behind furniture. */
export const FAN_RUN_ON_MINUTES = { from: 15, to: 20 } as const;
export const FURNITURE_GAP_CM = 5;

const TIPS = {
  "trickle-vents": {
    id: "trickle-vents",
    text: "Keep the trickle vents at the top of your windows open, day and night, if your windows have them.",
    values: {},
    ...COMMON,
  },
  "extract-fans": {
    id: "extract-fans",
    text:
      `Run the extractor fans while cooking and showering, and for about ${FAN_RUN_ON_MINUTES.from} to ` +
      `${FAN_RUN_ON_MINUTES.to} minutes after; keep pan lids on and the kitchen or bathroom door closed while you do.`,
    values: { from: FAN_RUN_ON_MINUTES.from, to: FAN_RUN_ON_MINUTES.to },
    ...COMMON,
  },
  "steady-heating": {
    id: "steady-heating",
    text:
      "Cold weather is forecast: if you can, keep the heating on steady and low through the day rather than " +
      "off and then high. Walls and windows stay warmer, so less water settles on them.",
    values: {},
    ...COMMON,
  },
  "furniture-off-walls": {
    id: "furniture-off-walls",
    text: `Leave a small gap (about ${FURNITURE_GAP_CM} cm) between large furniture and the outside walls so air can reach them.`,
    values: { gap: FURNITURE_GAP_CM },
    ...COMMON,
  },
  "wipe-windows": {
    id: "wipe-windows",
    text: "In the morning, wipe any water off windows and sills with a cloth and wring it out in the sink.",
    values: {},
    ...COMMON,
  },
  "keep-airing": {
    id: "keep-airing",
    text: "Little condensation is expected: keeping trickle vents open and fans on while cooking and showering helps it stay that way.",
    values: {},
    ...COMMON,
  },
} as const satisfies Record<string, OutlookAdvice>;

/** Always shown with the outlook, whatever it says. */
export const OUTLOOK_CAUTIONS: readonly OutlookAdvice[] = [
  {
    id: "report-damp",
    text:
      "If you see damp or mould, report it to your landlord, whatever this outlook says. Finding the cause " +
      "and putting it right is their job, and this outlook is only an estimate.",
    values: {},
    ...COMMON,
  },
  {
    id: "no-cooker-heating",
    text:
      "Never use a gas oven or hob, or a paraffin or bottled-gas heater without a flue, to warm your home: " +
      "they can give off carbon monoxide and they add moisture to the air.",
    values: {},
    basis: ADVICE_BASES["gas-safety"],
    basisId: "gas-safety",
  },
  {
    id: "keep-vents-clear",
    text: "Do not block air bricks, vents or trickle vents, even when it is cold.",
    values: {},
    ...COMMON,
  },
  {
    id: "qualified-trades",
    text:
      "If a fan, vent or heater does not work, tell your landlord rather than repairing it yourself: " +
      "gas and electrical work is for qualified trades.",
    values: {},
    ...COMMON,
  },
  {
    id: "health-advice",
    text:
      "If anyone at home has asthma or other breathing problems, or a weakened immune system, and there is damp " +
      "or mould, seek health advice (your GP or NHS 111).",
    values: {},
    basis: ADVICE_BASES["damp-health-guidance"],
    basisId: "damp-health-guidance",
  },
];

/** How the outlook is worked out, in plain words: the method and our assumptions, with their figures. */
export const OUTLOOK_METHOD: readonly OutlookLine[] = [
  {
    id: "surface-temperature",
    text:
      "The coldest surface of the home is estimated from the outdoor forecast by ISO 13788: " +
      "surface temperature = outdoor + fRsi × (indoor − outdoor), with fRsi from its walls and windows.",
    values: {},
  },
  {
    id: "surface-humidity",
    text: "The surface humidity is the room air's water vapour over what the air can hold at that surface temperature.",
    values: {},
  },
  {
    id: "indoor-steady",
    text: "Each room's indoor temperature and humidity are taken to stay as they are for the three days (our assumption).",
    values: {},
  },
  {
    id: "levels",
    text:
      `Levels are our own: condensation likely with ${LIKELY_CONDENSING_HOURS} or more hours at the dew point in a day; ` +
      `possible with any such hour or ${POSSIBLE_HOURS_AT_80} or more hours at ${MOULD_SURFACE_RH_PCT} % surface ` +
      "humidity or above; unlikely otherwise.",
    values: { likelyHours: LIKELY_CONDENSING_HOURS, possibleHours: POSSIBLE_HOURS_AT_80, mould: MOULD_SURFACE_RH_PCT },
  },
];

export interface TipFacts {
  /** Every room's days. */
  days: readonly OutlookDay[];
  /** The surface judged and the home's wall. */
  surface: BuildingElement;
  wall: BuildingElement;
  /** False when there was no forecast at all. */
  forecast: boolean;
}

/**
 * Tips matched to the outlook: the ventilation tips when any day shows some chance; steady heating
 * in a cold spell; wiping windows when glass is the surface expected to run wet; furniture off
 * walls when the wall is below the critical temperature factor (0.75, BRE IP 1/06) or the
 * coldest surface. With no forecast, the general ventilation tips.
 */
export function outlookTips(facts: TipFacts): OutlookAdvice[] {
  if (!facts.forecast) return [TIPS["trickle-vents"], TIPS["extract-fans"]];
  const some = facts.days.some((d) => d.level === "possible" || d.level === "likely");
  const condensing = facts.days.some((d) => d.condensingHours > 0);
  const lows = facts.days.flatMap((d) => (d.lowestOutdoorTemperatureC === null ? [] : [d.lowestOutdoorTemperatureC]));
  const cold = lows.length > 0 && Math.min(...lows) < COLD_SPELL_OUTDOOR_C;
  const tips: OutlookAdvice[] = [];
  if (some) tips.push(TIPS["trickle-vents"], TIPS["extract-fans"]);
  if (cold) tips.push(TIPS["steady-heating"]);
  if (condensing && facts.surface.kind === "glazing") tips.push(TIPS["wipe-windows"]);
  if (some && (facts.surface.kind === "opaque" || facts.wall.fRsi < CRITICAL_TEMPERATURE_FACTOR)) {
    tips.push(TIPS["furniture-off-walls"]);
  }
  if (!some) tips.push(TIPS["keep-airing"]);
  return tips;
}

function localDate(at: Date, zone: ZoneConverter): string {
  const ms = at.getTime();
  return new Date(ms + zone.offsetAt(ms)).toISOString().slice(0, 10);
}
