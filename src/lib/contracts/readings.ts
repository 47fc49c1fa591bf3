import { z } from "zod";
import { id, instant } from "./common.js";

export const READING_SOURCES = ["manual", "import"] as const;

/** One reading of a case (GET /api/cases/:id/readings). */
export const readingResponse = z.object({
  id,
  roomId: id,
  takenAt: instant,
  airTemperatureC: z.number(),
  relativeHumidityPct: z.number(),
  surfaceTemperatureC: z.number().nullable(),
  outdoorTemperatureC: z.number().nullable(),
  source: z.enum(READING_SOURCES),
  importId: id.nullable(),
});
export type ReadingResponse = z.infer<typeof readingResponse>;
export const readingsResponse = z.object({ readings: z.array(readingResponse) });

/** POST /api/cases/:id/readings: readings typed in by hand. */
export const readingsAddedResponse = z.object({
  imported: z.number().int(),
  duplicates: z.number().int(),
  rejected: z.number().int(),
});
export type ReadingsAdded = z.infer<typeof readingsAddedResponse>;

/** The columns the server proposes for a logger file: each is a column index from 0. */
export const importMapping = z.object({
  timestamp: z.number().int(),
  timeOfDay: z.number().int().optional(),
  temperature: z.number().int(),
  humidity: z.number().int(),
  surfaceTemperature: z.number().int().optional(),
  outdoorTemperature: z.number().int().optional(),
  temperatureUnit: z.enum(["C", "F"]),
  dateFormat: z.string(),
  timeZone: z.string(),
});

/** POST /api/cases/:id/readings/import/preview. */
export const importPreviewResponse = z.object({
  delimiter: z.enum([",", ";", "\t"]),
  decimalComma: z.boolean(),
  hasHeader: z.boolean(),
  headers: z.array(z.string()),
  mapping: importMapping,
  sampleRows: z.array(z.array(z.string())),
  problems: z.array(z.string()),
});
export type ImportPreviewResponse = z.infer<typeof importPreviewResponse>;

/** POST /api/cases/:id/readings/import. */
export const importResultResponse = z.object({
  importId: id,
  imported: z.number().int(),
  duplicates: z.number().int(),
  rejected: z.number().int(),
  rejectedReportUrl: z.string().optional(),
});
export type ImportResultResponse = z.infer<typeof importResultResponse>;
