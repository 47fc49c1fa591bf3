import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { StockImportPreviewResponse } from "@/lib/contracts/stock-imports";
import { stockImportKeys } from "@/lib/query-keys";

/** POST /api/stock-imports/preview: the server reads the start of the file and proposes the mapping. */
export function previewStockImport(file: File) {
  const body = new FormData();
  body.append("file", file, file.name);
  return api.post<StockImportPreviewResponse>("/stock-imports/preview", body);
}

export const usePreviewStockImport = () =>
  useMutation({ mutationKey: stockImportKeys.preview(), mutationFn: previewStockImport });
