// Did the fix work? The readings before the works against the readings after, through the same
// risk engine: surface humidity, hours at or above 80 % surface RH, and the VTT mould index.
// It is evidence for the person who decides, never the decision itself.
//
// Conventions (ours):
// - "Before" is every reading up to the works' completion, "after" every reading from it on.
// - Periods differ in length, so hours at ≥ 80 % are also given per day of readings
//   (hours ÷ covered days), and the comparison uses that rate.
// - The after period's mould index starts again from 0: the works (a mould wash in particular)
//   reset the surface, and what matters is whether mould can grow again.
// - `improved` (a hint only): after has at least a day of readings, its mean surface RH is lower and
//   its rate of hours at ≥ 80 % is not higher. Without enough readings after, it is null.
import type { ElementId } from "./surface.js";
import { evaluatePoint } from "./point.js";
import { evaluateSeries, type SeriesReading } from "./series.js";

const HOUR_MS = 3_600_000;
/** Less than this much reading time after the works is too little to compare (ours). */
export const MIN_AFTER_HOURS = 24;

export interface PeriodSummary {
  count: number;
  from: string | null;
  to: string | null;
  /** Hours the readings cover (gaps over the engine's limit are not counted). */
  coveredHours: number;
  meanSurfaceRhPct: number | null;
  maxSurfaceRhPct: number | null;
  hoursSurfaceRhAtLeast80: number;
  hoursAtLeast80PerDay: number | null;
  mouldIndexFinal: number | null;
  mouldIndexMax: number | null;
}

export interface BeforeAfter {
  worksDoneAt: string;
  before: PeriodSummary;
  after: PeriodSummary;
  improved: boolean | null;
  /** Surface RH per reading, for a chart with the works marked. */
  points: { at: string; surfaceRhPct: number; phase: "before" | "after" }[];
}

function summarise(
  readings: readonly SeriesReading[],
  element: ElementId | undefined,
  surfaceWet: boolean,
): { summary: PeriodSummary; rh: number[] } {
  if (readings.length === 0) {
    return {
      summary: {
        count: 0,
        from: null,
        to: null,
        coveredHours: 0,
        meanSurfaceRhPct: null,
        maxSurfaceRhPct: null,
        hoursSurfaceRhAtLeast80: 0,
        hoursAtLeast80PerDay: null,
        mouldIndexFinal: null,
        mouldIndexMax: null,
      },
      rh: [],
    };
  }
  const rh = readings.map((r) =>
    Math.min(
      100,
      evaluatePoint({
        airTemperatureC: r.airTemperatureC,
        relativeHumidityPct: r.relativeHumidityPct,
        surfaceTemperatureC: r.surfaceTemperatureC,
        outdoorTemperatureC: r.outdoorTemperatureC,
        element,
      }).surface.relativeHumidityPct,
    ),
  );
  const series = evaluateSeries({ readings, element, surfaceWet });
  const times = readings.map((r) => new Date(r.at).getTime());
  const gapsMs = series.gaps.reduce((s, g) => s + (Date.parse(g.to) - Date.parse(g.from)), 0);
  const coveredHours = Math.max(0, (Math.max(...times) - Math.min(...times) - gapsMs) / HOUR_MS);
  return {
    rh,
    summary: {
      count: readings.length,
      from: series.from,
      to: series.to,
      coveredHours,
      meanSurfaceRhPct: rh.reduce((s, v) => s + v, 0) / rh.length,
      maxSurfaceRhPct: Math.max(...rh),
      hoursSurfaceRhAtLeast80: series.hoursSurfaceRhAtLeast80,
      hoursAtLeast80PerDay: coveredHours >= 1 ? (series.hoursSurfaceRhAtLeast80 / coveredHours) * 24 : null,
      mouldIndexFinal: series.mouldIndex.final,
      mouldIndexMax: series.mouldIndex.max,
    },
  };
}

export function compareBeforeAfter(input: {
  readings: readonly SeriesReading[];
  worksDoneAt: Date;
  element?: ElementId;
  surfaceWet?: boolean;
}): BeforeAfter {
  const cut = input.worksDoneAt.getTime();
  const sorted = [...input.readings].sort((a, b) => new Date(a.at).getTime() - new Date(b.at).getTime());
  const beforeReadings = sorted.filter((r) => new Date(r.at).getTime() < cut);
  const afterReadings = sorted.filter((r) => new Date(r.at).getTime() >= cut);
  const before = summarise(beforeReadings, input.element, input.surfaceWet ?? false);
  // After the works the surface is cleaned and dry: not "wet" whatever the report said.
  const after = summarise(afterReadings, input.element, false);
  let improved: boolean | null = null;
  if (
    after.summary.coveredHours >= MIN_AFTER_HOURS &&
    before.summary.meanSurfaceRhPct !== null &&
    after.summary.meanSurfaceRhPct !== null
  ) {
    const rateBefore = before.summary.hoursAtLeast80PerDay ?? 0;
    const rateAfter = after.summary.hoursAtLeast80PerDay ?? 0;
    improved = after.summary.meanSurfaceRhPct < before.summary.meanSurfaceRhPct && rateAfter <= rateBefore;
  }
  const iso = (r: SeriesReading) => new Date(r.at).toISOString();
  return {
    worksDoneAt: input.worksDoneAt.toISOString(),
    before: before.summary,
    after: after.summary,
    improved,
    points: [
      ...beforeReadings.map((r, i) => ({ at: iso(r), surfaceRhPct: before.rh[i]!, phase: "before" as const })),
      ...afterReadings.map((r, i) => ({ at: iso(r), surfaceRhPct: after.rh[i]!, phase: "after" as const })),
    ],
  };
}
