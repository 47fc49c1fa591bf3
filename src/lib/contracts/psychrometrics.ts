// The risk engine's results (src/lib/domain point.ts, series.ts, verification.ts) as the API sends them.
import { z } from "zod";
import type { PointResult, SeriesResult } from "../domain/index.js";
import type { BeforeAfter } from "../domain/verification.js";
import { POINT_REASON_IDS } from "../domain/point.js";

export const SURFACE_STATES = ["dry", "borderline", "mould-risk", "condensing"] as const;
export const surfaceState = z.enum(SURFACE_STATES);
export const MATERIALS = ["very-sensitive", "sensitive", "medium-resistant", "resistant"] as const;
export const DIAGNOSIS_KINDS = [
  "ventilation-or-moisture-load",
  "cold-surface",
  "likely-not-condensation",
  "no-risk-found",
  "insufficient-data",
] as const;

/** POST /api/psychrometrics/evaluate, and each surface of a case's evaluation. */
export const pointResult = z.object({
  /** Over liquid water at any air temperature (WMO-No. 8 convention). */
  dewPointC: z.number(),
  /** Over ice, whenever the dew point is below 0 °C; null otherwise. */
  frostPointC: z.number().nullable(),
  vapourPressurePa: z.number(),
  saturationVapourPressurePa: z.number(),
  absoluteHumidityGPerM3: z.number(),
  humidityRatio: z.number(),
  surface: z.object({
    temperatureC: z.number(),
    source: z.enum(["measured", "estimated", "air"]),
    relativeHumidityPct: z.number(),
    temperatureFactor: z.number().optional(),
    state: surfaceState,
  }),
  reasons: z.array(z.string()),
  /** The same reasons by id and values, for a tenant screen to say in the reader's language. */
  reasonIds: z.array(z.object({ id: z.enum(POINT_REASON_IDS), values: z.record(z.string(), z.union([z.number(), z.string()])) })),
});

/** POST /api/psychrometrics/series, and each room's series in a case's evaluation. */
export const seriesResult = z.object({
  count: z.number().int(),
  from: z.string().nullable(),
  to: z.string().nullable(),
  hoursSurfaceRhAtLeast80: z.number(),
  hoursCondensing: z.number(),
  worstRolling30DayMeanSurfaceRhPct: z.number().nullable(),
  mouldIndex: z.object({ final: z.number(), max: z.number(), material: z.enum(MATERIALS) }),
  gaps: z.array(z.object({ from: z.string(), to: z.string() })),
  moistureExcess: z.object({ meanGPerM3: z.number(), loadClass: z.number() }).optional(),
  diagnosis: z.object({ kind: z.enum(DIAGNOSIS_KINDS), reasons: z.array(z.string()) }),
});

const periodSummary = z.object({
  count: z.number().int(),
  from: z.string().nullable(),
  to: z.string().nullable(),
  coveredHours: z.number(),
  meanSurfaceRhPct: z.number().nullable(),
  maxSurfaceRhPct: z.number().nullable(),
  hoursSurfaceRhAtLeast80: z.number(),
  hoursAtLeast80PerDay: z.number().nullable(),
  mouldIndexFinal: z.number().nullable(),
  mouldIndexMax: z.number().nullable(),
});

/** compareBeforeAfter's result (src/lib/domain/verification.ts). */
export const beforeAfter = z.object({
  worksDoneAt: z.string(),
  before: periodSummary,
  after: periodSummary,
  improved: z.boolean().nullable(),
  points: z.array(z.object({ at: z.string(), surfaceRhPct: z.number(), phase: z.enum(["before", "after"]) })),
});

// The domain's own types and these schemas must describe the same values, both ways.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const check = <T extends true>() => undefined as unknown as T;
check<Same<z.infer<typeof pointResult>, PointResult>>();
check<Same<z.infer<typeof seriesResult>, SeriesResult>>();
check<Same<z.infer<typeof beforeAfter>, BeforeAfter>>();
