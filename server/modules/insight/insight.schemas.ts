import { z } from "zod";
import { exportFormatSchema } from "../../../src/lib/contracts/export-query.js";
import { INSIGHT_TABLES } from "../../../src/lib/contracts/insight.js";

const isoDate = (field: string) =>
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${field} must be a date written YYYY-MM-DD.`)
    .refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), {
      message: `${field} is not a real date.`,
    });

/** The dashboard's filters, from the page's URL: London dates (inclusive) and one estate. */
export const insightQuerySchema = z
  .object({
    from: isoDate("from").optional(),
    to: isoDate("to").optional(),
    estate: z.string().trim().min(1).max(100).optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "from must not be after to.", path: ["from"] });
export type InsightQuery = z.infer<typeof insightQuerySchema>;

export const insightExportQuerySchema = z.intersection(
  insightQuerySchema,
  z.object({
    table: z.enum(INSIGHT_TABLES, { error: `table must be one of ${INSIGHT_TABLES.join(", ")}.` }),
    format: exportFormatSchema,
  }),
);
