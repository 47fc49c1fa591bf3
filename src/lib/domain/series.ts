// A time series of readings from one spot: hours at risk, the ISO 13788 monthly criterion, the
// VTT mould index, gaps, moisture excess and a diagnosis.
//
// Conventions (ours):
// - Readings are sorted by time first. Each reading's conditions hold from its time until the
//   next reading (a step function, no trapezoid), so hours, means and the mould model all see
//   the same picture.
// - An interval longer than MAX_INTEGRATION_GAP_HOURS is a gap: it is reported and nothing is
//   integrated across it. The mould index and its dry-spell clock are held through a gap.
// - Surface RH above 100 % is taken as 100 % for the means and the mould model (a surface
//   below the dew point is wet, not "more than saturated"); the condensing hours use ≥ 100 %.
// - Moisture excess is the plain mean over readings that carry an outdoor temperature (outdoor RH
//   assumed 85 % where missing); the measured temperature factor is Σ(θsi − θe)/Σ(θi − θe) over
//   readings with a measured surface and indoors at least 5 K warmer. Mean air RH and temperature
//   for the diagnosis are plain means over readings too.
// - No readings: count 0, from/to and the worst mean null, diagnosis insufficient-data.
// - Below 0 °C (psychrometrics.ts): air and outdoor RH are relative to water (WMO), a surface at or
//   below 0.01 °C is judged over ice (ISO 13788), so a frosting surface counts as condensing.
// - Hot path: saturation pressures only. The dew-point solve is never called per reading.
import { diagnose } from "./diagnosis.js";
import type { Diagnosis, DiagnosisFacts } from "./diagnosis.js";
import { isAbsent, requireRelativeHumidityPct, requireTemperatureC } from "./guards.js";
import { ASSUMED_OUTDOOR_RH_PCT, moistureLoadClass } from "./moisture-load.js";
import { createMouldIndexState, materialClass, stepMouldIndex } from "./mould-index.js";
import type { MaterialSensitivity } from "./mould-index.js";
import { GAS_CONSTANT_WATER_VAPOUR, TRIPLE_POINT_C, psatSurfacePa, psatWaterPa } from "./psychrometrics.js";
import { MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K, getBuildingElement } from "./surface.js";
import type { ElementId } from "./surface.js";

/** Longest interval between readings that is integrated; longer ones are gaps (ours). */
export const MAX_INTEGRATION_GAP_HOURS = 3;
/** ISO 13788 judges mould risk on a monthly mean; we slide a 30-day window. */
export const ROLLING_WINDOW_DAYS = 30;
/**
 * Our own: a 30-day window counts only if readings cover at least 15 days of it, so a window
 * that is mostly gap cannot set the worst mean from a few hours. If no window qualifies, the
 * mean over the whole series is used, as for a series shorter than 30 days.
 */
export const MIN_WINDOW_COVER_DAYS = 15;

export interface SeriesReading {
  /** ISO 8601 with an offset or Z (strings without one are read as local time). */
  at: Date | string;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC?: number;
  outdoorTemperatureC?: number;
  /** Missing → ASSUMED_OUTDOOR_RH_PCT, and the diagnosis says so. */
  outdoorRelativeHumidityPct?: number;
}

export interface SeriesInput {
  readings: readonly SeriesReading[];
  /** Used to estimate the surface temperature for readings without one but with an outdoor temperature. */
  element?: ElementId;
  material?: MaterialSensitivity;
  /** Dampness or water seen on the surface. */
  surfaceWet?: boolean;
}

export interface SeriesGap {
  from: string;
  to: string;
}

export interface SeriesResult {
  count: number;
  from: string | null;
  to: string | null;
  hoursSurfaceRhAtLeast80: number;
  hoursCondensing: number;
  worstRolling30DayMeanSurfaceRhPct: number | null;
  mouldIndex: { final: number; max: number; material: MaterialSensitivity };
  gaps: SeriesGap[];
  moistureExcess?: { meanGPerM3: number; loadClass: number };
  diagnosis: Diagnosis;
}

export interface MouldIndexPoint {
  at: string;
  m: number;
}

const MS_PER_HOUR = 3_600_000;
const GAP_MS = MAX_INTEGRATION_GAP_HOURS * MS_PER_HOUR;
const ZERO_CELSIUS_K = 273.15;

interface Scan {
  n: number;
  /** Sorted times, ms. */
  t: Float64Array;
  /** Surface RH per sorted reading, capped at 100 %. */
  surfaceRh: Float64Array;
  /** Mould index after each sorted reading, when asked for. */
  trace: Float64Array | undefined;
  material: MaterialSensitivity;
  mouldFinal: number;
  mouldMax: number;
  coveredHours: number;
  hours80: number;
  hoursCondensing: number;
  /** Index k of each reading that ends a gap (the gap runs from t[k − 1] to t[k]). */
  gapEnds: number[];
  airRhSum: number;
  airTSum: number;
  outdoorCount: number;
  assumedOutdoorRh: number;
  excessSum: number;
  outdoorTSum: number;
  factorNumerator: number;
  factorDenominator: number;
  sources: { measured: number; estimated: number; air: number };
  elementFactor: number | undefined;
}

function parseTime(at: Date | string, index: number): number {
  const ms = at instanceof Date ? at.getTime() : typeof at === "string" ? Date.parse(at) : Number.NaN;
  if (Number.isNaN(ms)) throw new RangeError(`reading ${index} has an invalid time: ${String(at)}`);
  return ms;
}

function scan(input: SeriesInput, withTrace: boolean): Scan {
  const readings = input.readings;
  const n = readings.length;
  const material = input.material ?? "very-sensitive";
  materialClass(material);
  const element = isAbsent(input.element) ? undefined : getBuildingElement(input.element);
  const elementFactor = element?.fRsi;

  const raw = new Float64Array(n);
  let sorted = true;
  for (let i = 0; i < n; i++) {
    raw[i] = parseTime(readings[i].at, i);
    if (i > 0 && raw[i] < raw[i - 1]) sorted = false;
  }
  let order: Uint32Array | undefined;
  let t = raw;
  if (!sorted) {
    order = new Uint32Array(n);
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => raw[a] - raw[b] || a - b);
    t = new Float64Array(n);
    for (let i = 0; i < n; i++) t[i] = raw[order[i]];
  }

  const surfaceRh = new Float64Array(n);
  const trace = withTrace ? new Float64Array(n) : undefined;
  const state = createMouldIndexState(material);
  const gapEnds: number[] = [];
  const sources = { measured: 0, estimated: 0, air: 0 };
  let coveredHours = 0;
  let hours80 = 0;
  let hoursCondensing = 0;
  let airRhSum = 0;
  let airTSum = 0;
  let outdoorCount = 0;
  let assumedOutdoorRh = 0;
  let excessSum = 0;
  let outdoorTSum = 0;
  let factorNumerator = 0;
  let factorDenominator = 0;
  let prevT = 0;
  let prevSurfaceT = 0;
  let prevSurfaceRh = 0;

  for (let k = 0; k < n; k++) {
    const index = order === undefined ? k : order[k];
    const r = readings[index];
    const airT = requireTemperatureC(r.airTemperatureC, "air temperature");
    const rh = requireRelativeHumidityPct(r.relativeHumidityPct, "relative humidity");
    const psatAir = psatWaterPa(airT);
    const pv = (rh * psatAir) / 100;
    const measured = r.surfaceTemperatureC;
    const outdoor = r.outdoorTemperatureC;
    const hasOutdoor = !isAbsent(outdoor);
    if (hasOutdoor) requireTemperatureC(outdoor, "outdoor temperature");

    let surfaceT: number;
    let sRh: number;
    if (!isAbsent(measured)) {
      surfaceT = requireTemperatureC(measured, "surface temperature");
      sRh = (100 * pv) / psatSurfacePa(surfaceT);
      sources.measured++;
      if (hasOutdoor && airT - outdoor >= MIN_TEMPERATURE_DIFFERENCE_FOR_FACTOR_K) {
        factorNumerator += surfaceT - outdoor;
        factorDenominator += airT - outdoor;
      }
    } else if (elementFactor !== undefined && hasOutdoor) {
      surfaceT = outdoor + elementFactor * (airT - outdoor);
      sRh = (100 * pv) / psatSurfacePa(surfaceT);
      sources.estimated++;
    } else {
      surfaceT = airT;
      sRh = airT > TRIPLE_POINT_C ? rh : (100 * pv) / psatSurfacePa(airT);
      sources.air++;
    }
    if (sRh > 100) sRh = 100;

    if (hasOutdoor) {
      let outdoorRh = r.outdoorRelativeHumidityPct;
      if (isAbsent(outdoorRh)) {
        outdoorRh = ASSUMED_OUTDOOR_RH_PCT;
        assumedOutdoorRh++;
      } else {
        requireRelativeHumidityPct(outdoorRh, "outdoor relative humidity");
      }
      const pvOutdoor = (outdoorRh * psatWaterPa(outdoor)) / 100;
      excessSum += (1000 * (pv / (airT + ZERO_CELSIUS_K) - pvOutdoor / (outdoor + ZERO_CELSIUS_K))) / GAS_CONSTANT_WATER_VAPOUR;
      outdoorTSum += outdoor;
      outdoorCount++;
    }
    airRhSum += rh;
    airTSum += airT;

    const time = t[k];
    if (k > 0) {
      const dtMs = time - prevT;
      if (dtMs > GAP_MS) {
        gapEnds.push(k);
      } else {
        const dtH = dtMs / MS_PER_HOUR;
        coveredHours += dtH;
        if (prevSurfaceRh >= 80) {
          hours80 += dtH;
          if (prevSurfaceRh >= 100) hoursCondensing += dtH;
        }
        stepMouldIndex(state, prevSurfaceT, prevSurfaceRh, dtH);
      }
    }
    if (trace !== undefined) trace[k] = state.m;
    surfaceRh[k] = sRh;
    prevT = time;
    prevSurfaceT = surfaceT;
    prevSurfaceRh = sRh;
  }

  return {
    n,
    t,
    surfaceRh,
    trace,
    material,
    mouldFinal: state.m,
    mouldMax: state.max,
    coveredHours,
    hours80,
    hoursCondensing,
    gapEnds,
    airRhSum,
    airTSum,
    outdoorCount,
    assumedOutdoorRh,
    excessSum,
    outdoorTSum,
    factorNumerator,
    factorDenominator,
    sources,
    elementFactor,
  };
}

/**
 * Worst time-weighted mean of a step function over any 30-day window, O(n) with two pointers.
 * The mean of a step function over a sliding window peaks when a window edge meets a reading, so
 * windows starting at each reading and windows ending at each reading cover every candidate.
 * (With the cover minimum, the true best may sit between alignments where a window's cover just
 * reaches the minimum; we only judge aligned windows — our convention.)
 * Series spanning less than 30 days: the mean over what there is. Null when nothing is covered.
 */
export function worstRollingMean(
  t: Float64Array,
  values: Float64Array,
  windowHours: number = ROLLING_WINDOW_DAYS * 24,
  minCoverHours: number = MIN_WINDOW_COVER_DAYS * 24,
  gapHours: number = MAX_INTEGRATION_GAP_HOURS,
): number | null {
  const n = t.length;
  if (n < 2) return null;
  const gapMs = gapHours * MS_PER_HOUR;
  // Prefix integrals at each reading, in %·h and h.
  const integral = new Float64Array(n);
  const cover = new Float64Array(n);
  for (let k = 1; k < n; k++) {
    const dtMs = t[k] - t[k - 1];
    const covered = dtMs <= gapMs;
    const dtH = covered ? dtMs / MS_PER_HOUR : 0;
    integral[k] = integral[k - 1] + values[k - 1] * dtH;
    cover[k] = cover[k - 1] + dtH;
  }
  const totalCover = cover[n - 1];
  if (totalCover === 0) return null;
  const overall = integral[n - 1] / totalCover;
  const windowMs = windowHours * MS_PER_HOUR;
  const first = t[0];
  const last = t[n - 1];
  if (last - first < windowMs) return overall;

  // Integral and cover from the start up to time x, with k the segment holding x.
  let partI = 0;
  let partC = 0;
  const at = (k: number, x: number): void => {
    if (k >= n - 1) {
      partI = integral[n - 1];
      partC = cover[n - 1];
      return;
    }
    const dtMs = t[k + 1] - t[k];
    const into = dtMs <= gapMs ? (x - t[k]) / MS_PER_HOUR : 0;
    partI = integral[k] + values[k] * into;
    partC = cover[k] + into;
  };

  let worst = -Infinity;
  // Windows starting at a reading.
  let k = 0;
  for (let i = 0; i < n && t[i] + windowMs <= last; i++) {
    const end = t[i] + windowMs;
    while (k < n - 1 && t[k + 1] <= end) k++;
    at(k, end);
    const c = partC - cover[i];
    if (c >= minCoverHours) {
      const mean = (partI - integral[i]) / c;
      if (mean > worst) worst = mean;
    }
  }
  // Windows ending at a reading.
  k = 0;
  for (let j = 0; j < n; j++) {
    const start = t[j] - windowMs;
    if (start < first) continue;
    while (k < n - 1 && t[k + 1] <= start) k++;
    at(k, start);
    const c = cover[j] - partC;
    if (c >= minCoverHours) {
      const mean = (integral[j] - partI) / c;
      if (mean > worst) worst = mean;
    }
  }
  return worst === -Infinity ? overall : worst;
}

export function evaluateSeries(input: SeriesInput): SeriesResult {
  const s = scan(input, false);
  const { n, t } = s;
  const worst = worstRollingMean(t, s.surfaceRh);
  const iso = (ms: number): string => new Date(ms).toISOString();

  let excess: DiagnosisFacts["moistureExcess"];
  if (s.outdoorCount > 0) {
    const meanGPerM3 = s.excessSum / s.outdoorCount;
    const meanOutdoorTemperatureC = s.outdoorTSum / s.outdoorCount;
    excess = {
      meanGPerM3,
      loadClass: moistureLoadClass(meanGPerM3, meanOutdoorTemperatureC),
      meanOutdoorTemperatureC,
      readings: s.outdoorCount,
      assumedOutdoorRhReadings: s.assumedOutdoorRh,
    };
  }

  const facts: DiagnosisFacts = {
    observedHours: s.coveredHours,
    worstRolling30DayMeanSurfaceRhPct: worst,
    hoursSurfaceRhAtLeast80: s.hours80,
    hoursCondensing: s.hoursCondensing,
    surfaceSources: s.sources,
  };
  if (input.surfaceWet !== undefined) facts.surfaceWet = input.surfaceWet;
  if (n > 0) {
    facts.meanAirRelativeHumidityPct = s.airRhSum / n;
    facts.meanAirTemperatureC = s.airTSum / n;
  }
  // A measured factor (ratio of sums over readings with indoors ≥ 5 K warmer) beats a typical one.
  if (s.factorDenominator > 0) {
    facts.temperatureFactor = { value: s.factorNumerator / s.factorDenominator, basis: "measured" };
  } else if (s.elementFactor !== undefined && s.sources.estimated > 0) {
    facts.temperatureFactor = { value: s.elementFactor, basis: "estimated" };
  }
  if (excess) facts.moistureExcess = excess;

  const gaps = s.gapEnds.map((k) => ({ from: iso(t[k - 1]), to: iso(t[k]) }));
  const diagnosis = diagnose(facts);
  const common = {
    count: n,
    from: n > 0 ? iso(t[0]) : null,
    to: n > 0 ? iso(t[n - 1]) : null,
    hoursSurfaceRhAtLeast80: s.hours80,
    hoursCondensing: s.hoursCondensing,
    worstRolling30DayMeanSurfaceRhPct: worst,
    mouldIndex: { final: s.mouldFinal, max: s.mouldMax, material: s.material },
    gaps,
  };
  return excess
    ? { ...common, moistureExcess: { meanGPerM3: excess.meanGPerM3, loadClass: excess.loadClass }, diagnosis }
    : { ...common, diagnosis };
}

/**
 * The mould index after each reading, for charts. With maxPoints, the readings are split into
 * maxPoints − 1 equal runs and the highest point of each is kept (peaks survive), then the last
 * reading is added.
 */
export function mouldIndexTrajectory(input: SeriesInput, options: { maxPoints?: number } = {}): MouldIndexPoint[] {
  const s = scan(input, true);
  const { n, t } = s;
  const trace = s.trace!;
  const point = (k: number): MouldIndexPoint => ({ at: new Date(t[k]).toISOString(), m: trace[k] });
  const maxPoints = options.maxPoints;
  if (maxPoints === undefined || n <= maxPoints) {
    const all: MouldIndexPoint[] = new Array(n);
    for (let k = 0; k < n; k++) all[k] = point(k);
    return all;
  }
  if (!(Number.isInteger(maxPoints) && maxPoints >= 2)) throw new RangeError("maxPoints must be an integer of 2 or more");
  const buckets = maxPoints - 1;
  const body = n - 1;
  const out: MouldIndexPoint[] = [];
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor((b * body) / buckets);
    const to = Math.floor(((b + 1) * body) / buckets);
    let best = from;
    for (let k = from + 1; k < to; k++) if (trace[k] > trace[best]) best = k;
    if (to > from) out.push(point(best));
  }
  out.push(point(n - 1));
  return out;
}
