// A room's live sensor figures and the alert rules judged on them, hour by hour.
//
// The figures are the risk engine's (series.ts conventions: each reading holds until the next, an
// interval over MAX_INTEGRATION_GAP_HOURS is a gap and counts nothing, surface RH is capped at 100 %
// and condensing means ≥ 100 %); the mould index is the engine's own trajectory (mould-index.ts
// through series.ts). What this module adds is WHEN: the rules are checked at every whole hour, on
// what the readings up to that hour show, so an alert carries the hour its rule first held, taken
// from the readings' times and never from the wall clock.
//
// The rules and their defaults are OUR OWN choice (no standard sets them), editable per landlord.
import { glazingElement, wallElement, type GlazingKind, type WallKind } from "./home-elements.js";
import { MAX_INTEGRATION_GAP_HOURS, mouldIndexTrajectory } from "./series.js";
import type { SeriesReading } from "./series.js";
import {
  CONDENSATION_SURFACE_RH_PCT,
  MOULD_SURFACE_RH_PCT,
  estimateSurfaceTemperatureC,
  getBuildingElement,
  surfaceRelativeHumidityPct,
} from "./surface.js";
import type { ElementId } from "./surface.js";
import { vapourPressurePa } from "./psychrometrics.js";
import { DEFAULT_TIME_ZONE, ZoneConverter } from "./time-zone.js";

export const SENSOR_ALERT_RULES = ["mould-index", "hours-at-80", "condensing-days"] as const;
export type SensorAlertRule = (typeof SENSOR_ALERT_RULES)[number];

export interface SensorAlertSettings {
  /** The mould index (VTT, 0–6) at or above which the room is at risk. */
  mouldIndexAtLeast: number;
  /** Hours at ≥ 80 % surface RH within the last 7 days (168 h) at or above which the room is at risk. */
  hoursAt80In7Days: number;
  /** Days (London calendar days, the last 7) with any condensing at or above which the room is at risk. */
  condensingDaysIn7Days: number;
  /** A rule that keeps holding raises no new alert for the same room within this many days. */
  cooldownDays: number;
}

/**
 * OUR OWN defaults, no source: mould index 1 is the model's "microscopic traces" (the first sign the
 * surface is growing mould, before anyone sees it); 72 h of 168 is three days' worth at the surface RH
 * where mould can start (80 %, surface.ts); condensing on 3 of 7 days is a pattern, not one cold night;
 * 7 days' cooldown keeps a room that stays wet to one alert a week.
 */
export const DEFAULT_SENSOR_ALERT_SETTINGS: Readonly<SensorAlertSettings> = {
  mouldIndexAtLeast: 1,
  hoursAt80In7Days: 72,
  condensingDaysIn7Days: 3,
  cooldownDays: 7,
};

/** Our own sanity bounds for a landlord's settings. */
export const SENSOR_ALERT_BOUNDS = {
  mouldIndexAtLeast: { min: 0.5, max: 6 },
  hoursAt80In7Days: { min: 1, max: 168 },
  condensingDaysIn7Days: { min: 1, max: 7 },
  cooldownDays: { min: 1, max: 90 },
} as const;

export const WATCH_WINDOW_DAYS = 7;
/** Readings the mould index is run over (it builds up over weeks): our own choice. */
export const MOULD_HISTORY_DAYS = 30;

/** Where the surface RH came from: a probe on the surface, the element's fRsi and the outdoor temperature, or air RH alone. */
export type SurfaceBasis = "measured" | "estimated" | "air";

export interface SensorSample {
  at: Date;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  /** The outdoor temperature for that hour (weather), when known. */
  outdoorTemperatureC?: number | null;
}

export interface DayFigures {
  /** London calendar date, YYYY-MM-DD. */
  date: string;
  hoursAt80: number;
  hoursCondensing: number;
}

export interface WatchFigures {
  hoursAt80: number;
  hoursCondensing: number;
  condensingDays: number;
  mouldIndex: number;
}

export interface RuleHeld {
  rule: SensorAlertRule;
  /** The whole hour (UTC) at which the rule held on the readings up to it. */
  at: Date;
  figures: WatchFigures;
}

export interface RoomWatch {
  basis: SurfaceBasis;
  latest: { at: Date; airTemperatureC: number; relativeHumidityPct: number; surfaceRelativeHumidityPct: number } | null;
  /** The 7 days up to the latest reading. */
  last7Days: WatchFigures;
  /** The last 7 London days, oldest first, ending with the latest reading's day. */
  days: DayFigures[];
  /** Every whole hour in the 7 days up to the latest reading at which each rule held, in time order. */
  held: RuleHeld[];
}

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;
const GAP_MS = MAX_INTEGRATION_GAP_HOURS * HOUR_MS;
const london = new ZoneConverter(DEFAULT_TIME_ZONE);

/** The London calendar date of an instant. */
export function londonDate(ms: number): string {
  return new Date(ms + london.offsetAt(ms)).toISOString().slice(0, 10);
}

/**
 * The element a sensor watches, from where it was fitted: by a window, the home's glazing; in a
 * corner, the corner's thermal bridge; anywhere else, the home's walls. Ours.
 */
export function sensorElement(home: { glazingType: GlazingKind; wallType: WallKind }, placement: string): ElementId {
  if (/window|glaz|pane|sill/i.test(placement)) return glazingElement(home.glazingType);
  if (/corner/i.test(placement)) return "corner-thermal-bridge";
  return wallElement(home.wallType);
}

/** Surface RH of one reading (capped at 100 %) and what it rests on, as series.ts works it out. */
function surfaceOf(s: SensorSample, fRsi: number | undefined): { rh: number; basis: SurfaceBasis } {
  const pv = vapourPressurePa(s.airTemperatureC, s.relativeHumidityPct);
  let surfaceT: number;
  let basis: SurfaceBasis;
  if (s.surfaceTemperatureC !== null) {
    surfaceT = s.surfaceTemperatureC;
    basis = "measured";
  } else if (fRsi !== undefined && s.outdoorTemperatureC !== null && s.outdoorTemperatureC !== undefined) {
    surfaceT = estimateSurfaceTemperatureC(fRsi, s.airTemperatureC, s.outdoorTemperatureC);
    basis = "estimated";
  } else {
    return { rh: Math.min(100, s.relativeHumidityPct), basis: "air" };
  }
  return { rh: Math.min(100, surfaceRelativeHumidityPct(pv, surfaceT)), basis };
}

/**
 * A room's figures over its sensor's readings (any order), with every whole hour in the last 7 days
 * at which each rule held. `element` is used only for readings without a measured surface and with
 * an outdoor temperature; without either, surface RH is the air's and the basis says "air".
 */
export function watchRoom(input: {
  samples: readonly SensorSample[];
  element?: ElementId;
  settings: SensorAlertSettings;
}): RoomWatch {
  const samples = [...input.samples].sort((a, b) => a.at.getTime() - b.at.getTime());
  const n = samples.length;
  const empty: WatchFigures = { hoursAt80: 0, hoursCondensing: 0, condensingDays: 0, mouldIndex: 0 };
  if (n === 0) return { basis: "air", latest: null, last7Days: empty, days: [], held: [] };
  const fRsi = input.element === undefined ? undefined : getBuildingElement(input.element).fRsi;
  const t = samples.map((s) => s.at.getTime());
  const surface = samples.map((s) => surfaceOf(s, fRsi));
  const counts = { measured: 0, estimated: 0, air: 0 };
  for (const s of surface) counts[s.basis]++;
  const basis: SurfaceBasis = counts.measured > 0 ? "measured" : counts.estimated > 0 ? "estimated" : "air";

  // The engine's mould index after each reading (same readings, same element).
  const series: SeriesReading[] = samples.map((s) => ({
    at: s.at,
    airTemperatureC: s.airTemperatureC,
    relativeHumidityPct: s.relativeHumidityPct,
    surfaceTemperatureC: s.surfaceTemperatureC ?? undefined,
    outdoorTemperatureC: s.outdoorTemperatureC ?? undefined,
  }));
  const trace = mouldIndexTrajectory({ readings: series, element: input.element });

  // Hours at ≥ 80 % and condensing in each clock hour, from the step function between readings.
  const h0 = Math.floor(t[0] / HOUR_MS);
  const hours = Math.floor(t[n - 1] / HOUR_MS) - h0 + 1;
  const at80 = new Float64Array(hours);
  const cond = new Float64Array(hours);
  for (let k = 1; k < n; k++) {
    const dt = t[k] - t[k - 1];
    if (dt > GAP_MS || dt === 0) continue;
    const rh = surface[k - 1].rh;
    if (rh < MOULD_SURFACE_RH_PCT) continue;
    let from = t[k - 1];
    while (from < t[k]) {
      const hour = Math.floor(from / HOUR_MS);
      const to = Math.min(t[k], (hour + 1) * HOUR_MS);
      const part = (to - from) / HOUR_MS;
      at80[hour - h0] += part;
      if (rh >= CONDENSATION_SURFACE_RH_PCT) cond[hour - h0] += part;
      from = to;
    }
  }

  const dayOfHour = (i: number) => londonDate((h0 + i) * HOUR_MS);
  /** Figures at the checkpoint that ends clock hour `end` (exclusive index), i.e. at (h0 + end)·1h. */
  const figuresAt = (end: number, mouldAt: number): WatchFigures => {
    let a = 0;
    let c = 0;
    const days = new Set<string>();
    const lastDay = dayOfHour(end - 1);
    const firstDayMs = Date.parse(`${lastDay}T12:00:00Z`) - (WATCH_WINDOW_DAYS - 1) * DAY_MS;
    const firstDay = new Date(firstDayMs).toISOString().slice(0, 10);
    for (let i = Math.max(0, end - WATCH_WINDOW_DAYS * 24); i < end; i++) {
      a += at80[i];
      c += cond[i];
    }
    // Condensing days count whole London days (the checkpoint's day and the 6 before), however far back that goes.
    for (let i = end - 1; i >= 0; i--) {
      const d = dayOfHour(i);
      if (d < firstDay) break;
      if (cond[i] > 0) days.add(d);
    }
    return { hoursAt80: a, hoursCondensing: c, condensingDays: days.size, mouldIndex: mouldAt };
  };

  const held: RuleHeld[] = [];
  const windowStart = t[n - 1] - WATCH_WINDOW_DAYS * DAY_MS;
  let k = 0;
  // Checkpoint at each whole hour H from the first hour after the first reading to the last reading.
  for (let end = 1; (h0 + end) * HOUR_MS <= t[n - 1]; end++) {
    const H = (h0 + end) * HOUR_MS;
    while (k + 1 < n && t[k + 1] <= H) k++;
    if (H <= windowStart) continue;
    const f = figuresAt(end, trace[k].m);
    const at = new Date(H);
    if (f.mouldIndex >= input.settings.mouldIndexAtLeast) held.push({ rule: "mould-index", at, figures: f });
    if (f.hoursAt80 >= input.settings.hoursAt80In7Days) held.push({ rule: "hours-at-80", at, figures: f });
    if (f.condensingDays >= input.settings.condensingDaysIn7Days) held.push({ rule: "condensing-days", at, figures: f });
  }

  // The figures up to the latest reading (the partial hour it ends in included) and per day.
  const lastEnd = hours;
  const last7Days = figuresAt(lastEnd, trace[n - 1].m);
  // The partial last hour: only what lies before the last reading was added to its bucket, which is exact.
  const dayTotals = new Map<string, DayFigures>();
  const lastDay = londonDate(t[n - 1]);
  const days: DayFigures[] = [];
  for (let d = WATCH_WINDOW_DAYS - 1; d >= 0; d--) {
    const date = new Date(Date.parse(`${lastDay}T12:00:00Z`) - d * DAY_MS).toISOString().slice(0, 10);
    const row = { date, hoursAt80: 0, hoursCondensing: 0 };
    dayTotals.set(date, row);
    days.push(row);
  }
  for (let i = 0; i < hours; i++) {
    const row = dayTotals.get(dayOfHour(i));
    if (!row) continue;
    row.hoursAt80 += at80[i];
    row.hoursCondensing += cond[i];
  }
  const last = samples[n - 1];
  return {
    basis,
    latest: {
      at: last.at,
      airTemperatureC: last.airTemperatureC,
      relativeHumidityPct: last.relativeHumidityPct,
      surfaceRelativeHumidityPct: surface[n - 1].rh,
    },
    last7Days,
    days,
    held,
  };
}

/**
 * The hours at which alerts are raised: for each rule, the first hour it held, then the first hour
 * it held again at least `cooldownDays` after the alert before it (`lastRaised`: the latest stored
 * alert per rule). Idempotent: the same readings and stored alerts give the same hours.
 */
export function alertsToRaise(
  held: readonly RuleHeld[],
  lastRaised: Partial<Record<SensorAlertRule, Date>>,
  cooldownDays: number,
): RuleHeld[] {
  const cooldownMs = cooldownDays * DAY_MS;
  const last = new Map<SensorAlertRule, number>();
  for (const rule of SENSOR_ALERT_RULES) {
    const at = lastRaised[rule];
    if (at) last.set(rule, at.getTime());
  }
  const out: RuleHeld[] = [];
  for (const h of held) {
    const before = last.get(h.rule);
    const at = h.at.getTime();
    if (before !== undefined && at < before + cooldownMs) continue;
    out.push(h);
    last.set(h.rule, at);
  }
  return out;
}
