import type { z } from "zod";
import type { stockImportResponse } from "../../../src/lib/contracts/stock-imports.js";
import type { StockImport } from "./stock-import.entity.js";

export const toStockImportDto = (i: StockImport): z.input<typeof stockImportResponse> => ({
  id: i.id,
  fileName: i.fileName,
  created: i.created,
  updated: i.updated,
  unchanged: i.unchanged,
  refused: i.refused,
  createdAt: i.createdAt.toISOString(),
  reportUrl: `/api/stock-imports/${i.id}/report.csv`,
});
