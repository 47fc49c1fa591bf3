import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { StockImportPreviewResponse, StockImportResponse } from "@/lib/contracts/stock-imports";
import { propertyKeys, stockImportKeys } from "@/lib/query-keys";

export type StockMapping = StockImportPreviewResponse["mapping"];

/** POST /api/stock-imports: the file with the admin's mapping (every field, null for "not in this file"). */
export function runStockImport({ file, mapping }: { file: File; mapping: Record<string, number | null> }) {
  const body = new FormData();
  body.append("mapping", JSON.stringify(mapping));
  body.append("file", file, file.name);
  return api.post<StockImportResponse>("/stock-imports", body);
}

export function useRunStockImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: stockImportKeys.run(),
    mutationFn: runStockImport,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: stockImportKeys.all }),
        queryClient.invalidateQueries({ queryKey: propertyKeys.all }),
      ]),
  });
}
