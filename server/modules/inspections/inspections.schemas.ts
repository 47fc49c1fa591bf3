import { z } from "zod";
import { airTemperatureC, surfaceTemperatureC } from "../../../src/lib/schemas/psychrometrics.js";
import { CAUSES, MOULD_EXTENTS } from "./inspection.entity.js";

export const inspectionSchema = z.object({
  inspectedAt: z.iso.datetime({ offset: true, error: "inspectedAt must be an ISO 8601 date-time with a time zone." }),
  cause: z.enum(CAUSES, { error: `cause must be one of ${CAUSES.join(", ")}.` }),
  mouldExtent: z.enum(MOULD_EXTENTS, { error: `mouldExtent must be one of ${MOULD_EXTENTS.join(", ")}.` }),
  findings: z
    .string({ error: "Describe what was found." })
    .trim()
    .min(10, "Describe what was found in a sentence or two.")
    .max(8000),
  roomReadings: z
    .array(
      z.object({
        roomId: z.number().int().positive(),
        airTemperatureC: airTemperatureC.optional(),
        relativeHumidityPct: z.number().gt(0).max(100).optional(),
        surfaceTemperaturesC: z.array(surfaceTemperatureC).max(20).optional(),
        moisture: z.object({ value: z.number().min(0).max(100), unit: z.enum(["pct", "wme"]) }).optional(),
        note: z.string().trim().max(1000).optional(),
      }),
    )
    .max(30)
    .default([]),
});
export type InspectionInput = z.infer<typeof inspectionSchema>;

export const summarySchema = z.object({
  body: z
    .string({ error: "Write the summary for the tenant." })
    .trim()
    .min(20, "Write the summary for the tenant: findings, what will be done and by when.")
    .max(10000),
});
