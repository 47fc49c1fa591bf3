import { z } from "zod";
import { airTemperatureC, outdoorTemperatureC, surfaceTemperatureC } from "../../../src/lib/schemas/psychrometrics.js";
import { idParam } from "../../lib/validation.js";
import { exportFormatSchema } from "../../../src/lib/contracts/export-query.js";

const rh = z
  .number({ error: "relativeHumidityPct must be a number in %." })
  .gt(0, "relativeHumidityPct must be more than 0 %.")
  .max(100, "relativeHumidityPct must be at most 100 %.");

export const MAX_MANUAL_READINGS = 500;

export const manualReadingsSchema = z
  .array(
    z.object({
      roomId: z.number({ error: "roomId is required: which room was this reading taken in?" }).int().positive(),
      takenAt: z.iso.datetime({ offset: true, error: "takenAt must be an ISO 8601 date-time with a time zone." }),
      airTemperatureC,
      relativeHumidityPct: rh,
      surfaceTemperatureC: surfaceTemperatureC.optional(),
      outdoorTemperatureC: outdoorTemperatureC.optional(),
    }),
    { error: "Send a list of readings." },
  )
  .min(1, "Send at least one reading.")
  .max(MAX_MANUAL_READINGS, `Send at most ${MAX_MANUAL_READINGS} readings at once; use a CSV import for more.`);

export const readingsQuerySchema = z.object({
  roomId: idParam("roomId").optional(),
});

/** GET /api/cases/:id/readings/export: one room or all, and the format. */
export const readingsExportQuerySchema = readingsQuerySchema.extend({ format: exportFormatSchema });

export const importFieldsSchema = z.object({
  roomId: z.coerce.number({ error: "roomId is required: which room was the logger in?" }).int().positive(),
  mapping: z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s === "") return undefined;
      try {
        return JSON.parse(s) as Record<string, unknown>;
      } catch {
        ctx.addIssue({ code: "custom", message: "mapping must be JSON." });
        return z.NEVER;
      }
    }),
});

export const importParamsSchema = z.object({
  id: idParam("The id"),
  importId: idParam("The import id"),
});
