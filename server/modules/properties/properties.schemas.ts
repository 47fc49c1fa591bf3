import { z } from "zod";
import { idParam } from "../../lib/validation.js";
import { exportFormatSchema } from "../../../src/lib/contracts/export-query.js";

export const propertyListQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  estate: z.string().trim().max(100).optional(),
  page: z.coerce.number({ error: "page must be a number." }).int().min(1, "page starts at 1.").default(1),
  pageSize: z.coerce
    .number({ error: "pageSize must be a number." })
    .int()
    .min(1)
    .max(200, "pageSize can be at most 200.")
    .default(25),
});
export type PropertyListQuery = z.infer<typeof propertyListQuerySchema>;

/** GET /api/properties/export: the list's filters (every page) and the format. */
export const propertyExportQuerySchema = propertyListQuerySchema
  .omit({ page: true, pageSize: true })
  .extend({ format: exportFormatSchema });

export const idParamsSchema = z.object({
  id: idParam("The id"),
});

export const roomParamsSchema = idParamsSchema.extend({
  roomId: idParam("The room id"),
});

/** POST /api/stock-imports (multipart): the mapping's corrections, as JSON text, e.g. {"uprn": 0, "rooms": null}. */
export const stockImportFieldsSchema = z.object({
  mapping: z.string().max(10_000, "mapping is too long.").optional(),
});
