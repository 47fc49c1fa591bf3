import { queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { api } from "@/lib/api-client";
import type { stockImportListResponse } from "@/lib/contracts/stock-imports";
import { stockImportKeys } from "@/lib/query-keys";

export type StockImportList = z.infer<typeof stockImportListResponse>;

/** GET /api/stock-imports: the landlord's imports, newest first. */
export const getStockImports = () => api.get<StockImportList>("/stock-imports");

export const stockImportsQueryOptions = () => queryOptions({ queryKey: stockImportKeys.lists(), queryFn: getStockImports });

export const useStockImports = () => useQuery(stockImportsQueryOptions());
