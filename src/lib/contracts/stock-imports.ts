// The stock import (an admin brings in the landlord's asset register): the preview and the result.
import { z } from "zod";
import { STOCK_FIELDS } from "../domain/stock-register.js";
import { id, instant } from "./common.js";

const column = z.number().int().min(0);

/** POST /api/stock-imports/preview: how we would read the file, before anything is stored. */
export const stockImportPreviewResponse = z.object({
  format: z.enum(["csv", "xlsx"]),
  /** The CSV separator found (null for a workbook). */
  delimiter: z.enum([",", ";", "\t"]).nullable(),
  headers: z.array(z.string()),
  /** Which column (0 is the first) feeds each field; a field without a column is left out. */
  mapping: z.partialRecord(z.enum(STOCK_FIELDS), column),
  /** The fields a column can feed, in order. */
  fields: z.array(z.enum(STOCK_FIELDS)),
  /** The first rows under the header, as written. */
  sampleRows: z.array(z.array(z.string())),
  /** What must still be chosen before the import can run, in words. */
  missing: z.array(z.string()),
});
export type StockImportPreviewResponse = z.infer<typeof stockImportPreviewResponse>;

/** POST /api/stock-imports and GET /api/stock-imports/:id: the counts of one import. */
export const stockImportResponse = z.object({
  id,
  fileName: z.string(),
  created: z.number().int().min(0),
  updated: z.number().int().min(0),
  unchanged: z.number().int().min(0),
  refused: z.number().int().min(0),
  createdAt: instant,
  /** Every row's outcome as CSV. */
  reportUrl: z.string(),
});
export type StockImportResponse = z.infer<typeof stockImportResponse>;

export const stockImportListResponse = z.object({ imports: z.array(stockImportResponse) });
