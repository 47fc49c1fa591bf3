// Dew point and surface humidity for each reading, computed in the browser with the same engine
// the server uses. Cheap enough for 50 000 readings (a dew-point solve is a few microseconds).
import { dewPointC, surfaceRelativeHumidityPct, vapourPressurePa } from "@/lib/domain";
import type { CaseReading } from "../api/types";

export interface Derived {
  dewPointC: number | null;
  /** Raw ratio: above 100 means the surface is below the dew point. */
  surfaceRhPct: number | null;
}

export function derive(r: Pick<CaseReading, "airTemperatureC" | "relativeHumidityPct" | "surfaceTemperatureC">): Derived {
  try {
    const dp = dewPointC(r.airTemperatureC, r.relativeHumidityPct);
    const surface =
      r.surfaceTemperatureC === null || r.surfaceTemperatureC === undefined
        ? null
        : surfaceRelativeHumidityPct(vapourPressurePa(r.airTemperatureC, r.relativeHumidityPct), r.surfaceTemperatureC);
    return { dewPointC: dp, surfaceRhPct: surface };
  } catch {
    // A value outside the engine's domain: show the reading without the derived numbers.
    return { dewPointC: null, surfaceRhPct: null };
  }
}

export interface ChartSeries {
  /** Unix seconds, ascending. */
  t: Float64Array;
  air: (number | null)[];
  rh: (number | null)[];
  dewPoint: (number | null)[];
  /** Capped at 100 %: a surface below the dew point is wet, not "more than saturated". */
  surfaceRh: (number | null)[];
  hasSurface: boolean;
}

/** A pause longer than this many usual intervals between readings is drawn as a gap, not a line. */
export const GAP_FACTOR = 3;

/** The median time between consecutive readings, in seconds (0 with fewer than two). */
export function usualInterval(times: ArrayLike<number>): number {
  const steps: number[] = [];
  for (let i = 1; i < times.length; i++) {
    const step = times[i]! - times[i - 1]!;
    if (step > 0) steps.push(step);
  }
  if (steps.length === 0) return 0;
  steps.sort((a, b) => a - b);
  return steps[Math.floor(steps.length / 2)]!;
}

/**
 * The readings as aligned columns for the chart, oldest first. Where the readings pause for more
 * than GAP_FACTOR usual intervals, a point with no values is put in the pause, so the lines stop
 * there (uPlot leaves a gap at a null) rather than drawing across hours with no readings.
 */
export function chartSeries(readings: readonly CaseReading[]): ChartSeries {
  const sorted = isSorted(readings) ? readings : [...readings].sort((a, b) => Date.parse(a.takenAt) - Date.parse(b.takenAt));
  const times = sorted.map((r) => Date.parse(r.takenAt) / 1000);
  const usual = usualInterval(times);
  const gaps = usual > 0 ? times.filter((t, i) => i > 0 && t - times[i - 1]! > GAP_FACTOR * usual).length : 0;
  const n = sorted.length + gaps;
  const out: ChartSeries = {
    t: new Float64Array(n),
    air: new Array(n),
    rh: new Array(n),
    dewPoint: new Array(n),
    surfaceRh: new Array(n),
    hasSurface: false,
  };
  let j = 0;
  for (let i = 0; i < sorted.length; i++) {
    const r = sorted[i]!;
    if (usual > 0 && i > 0 && times[i]! - times[i - 1]! > GAP_FACTOR * usual) {
      out.t[j] = (times[i - 1]! + times[i]!) / 2;
      out.air[j] = out.rh[j] = out.dewPoint[j] = out.surfaceRh[j] = null;
      j++;
    }
    const d = derive(r);
    out.t[j] = times[i]!;
    out.air[j] = r.airTemperatureC;
    out.rh[j] = r.relativeHumidityPct;
    out.dewPoint[j] = d.dewPointC;
    out.surfaceRh[j] = d.surfaceRhPct === null ? null : Math.min(100, d.surfaceRhPct);
    if (d.surfaceRhPct !== null) out.hasSurface = true;
    j++;
  }
  return out;
}

function isSorted(readings: readonly CaseReading[]): boolean {
  for (let i = 1; i < readings.length; i++) if (readings[i]!.takenAt < readings[i - 1]!.takenAt) return false;
  return true;
}
