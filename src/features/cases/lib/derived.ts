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

export function chartSeries(readings: readonly CaseReading[]): ChartSeries {
  const sorted = isSorted(readings) ? readings : [...readings].sort((a, b) => Date.parse(a.takenAt) - Date.parse(b.takenAt));
  const n = sorted.length;
  const out: ChartSeries = {
    t: new Float64Array(n),
    air: new Array(n),
    rh: new Array(n),
    dewPoint: new Array(n),
    surfaceRh: new Array(n),
    hasSurface: false,
  };
  for (let i = 0; i < n; i++) {
    const r = sorted[i]!;
    const d = derive(r);
    out.t[i] = Date.parse(r.takenAt) / 1000;
    out.air[i] = r.airTemperatureC;
    out.rh[i] = r.relativeHumidityPct;
    out.dewPoint[i] = d.dewPointC;
    out.surfaceRh[i] = d.surfaceRhPct === null ? null : Math.min(100, d.surfaceRhPct);
    if (d.surfaceRhPct !== null) out.hasSurface = true;
  }
  return out;
}

function isSorted(readings: readonly CaseReading[]): boolean {
  for (let i = 1; i < readings.length; i++) if (readings[i]!.takenAt < readings[i - 1]!.takenAt) return false;
  return true;
}
