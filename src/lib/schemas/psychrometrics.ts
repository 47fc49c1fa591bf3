// Request schemas of the public psychrometrics API, shared by the server (validation at the edge)
// and the calculator page (the same ranges in the form).
import { z } from "zod";
import { ELEMENT_IDS } from "../domain/surface.js";
import { MATERIAL_SENSITIVITIES } from "../domain/mould-index.js";

/** Largest series the API evaluates in one request; more is 413. */
export const MAX_SERIES_READINGS = 100_000;

const celsius = (field: string, min: number, max: number) =>
  z
    .number({ error: (issue) => (issue.input === undefined ? `${field} is required.` : `${field} must be a number in °C.`) })
    .min(min, `${field} must be at least ${min} °C.`)
    .max(max, `${field} must be at most ${max} °C.`);

const relativeHumidity = z
  .number({
    error: (issue) =>
      issue.input === undefined ? "relativeHumidityPct is required." : "relativeHumidityPct must be a number in %.",
  })
  .gt(0, "relativeHumidityPct must be more than 0 %.")
  .max(100, "relativeHumidityPct must be at most 100 %.");

// Physical ranges for rooms in homes: air −20…50 °C, surfaces −30…50 °C, outdoors −30…40 °C.
export const airTemperatureC = celsius("airTemperatureC", -20, 50);
export const surfaceTemperatureC = celsius("surfaceTemperatureC", -30, 50);
export const outdoorTemperatureC = celsius("outdoorTemperatureC", -30, 40);

const element = z.enum(ELEMENT_IDS, { error: `element must be one of ${ELEMENT_IDS.join(", ")}.` });
const material = z.enum(MATERIAL_SENSITIVITIES as [string, ...string[]], {
  error: `material must be one of ${MATERIAL_SENSITIVITIES.join(", ")}.`,
});

export const evaluatePointSchema = z.object({
  airTemperatureC,
  relativeHumidityPct: relativeHumidity,
  surfaceTemperatureC: surfaceTemperatureC.optional(),
  outdoorTemperatureC: outdoorTemperatureC.optional(),
  element: element.optional(),
  pressurePa: z
    .number({ error: "pressurePa must be a number in Pa." })
    .min(50_000, "pressurePa must be at least 50 000 Pa.")
    .max(110_000, "pressurePa must be at most 110 000 Pa.")
    .optional(),
});
export type EvaluatePointRequest = z.infer<typeof evaluatePointSchema>;

export const seriesReadingSchema = z.object({
  at: z.iso.datetime({ offset: true, error: "at must be an ISO 8601 date-time with a time zone, e.g. 2026-01-15T07:00:00Z." }),
  airTemperatureC,
  relativeHumidityPct: relativeHumidity,
  surfaceTemperatureC: surfaceTemperatureC.optional(),
  outdoorTemperatureC: outdoorTemperatureC.optional(),
  /** Where a logger also records outdoor humidity; otherwise the engine assumes a typical value and says so. */
  outdoorRelativeHumidityPct: z
    .number({ error: "outdoorRelativeHumidityPct must be a number in %." })
    .gt(0, "outdoorRelativeHumidityPct must be more than 0 %.")
    .max(100, "outdoorRelativeHumidityPct must be at most 100 %.")
    .optional(),
});

export const evaluateSeriesSchema = z.object({
  readings: z
    .array(seriesReadingSchema, { error: "readings must be an array of readings." })
    .min(1, "readings needs at least one reading."),
  element: element.optional(),
  material: material.optional(),
});
export type EvaluateSeriesRequest = z.infer<typeof evaluateSeriesSchema>;
