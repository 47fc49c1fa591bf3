import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { TenancyImportPreview } from "@/lib/contracts";
import { tenancyImportKeys } from "@/lib/query-keys";

/** POST /api/tenancy-imports/preview: the server reads the file and proposes which column is which. */
export function previewTenancyImport(file: File) {
  const body = new FormData();
  body.append("file", file, file.name);
  return api.post<TenancyImportPreview>("/tenancy-imports/preview", body);
}

export function usePreviewTenancyImport() {
  return useMutation({ mutationKey: tenancyImportKeys.preview(), mutationFn: previewTenancyImport });
}
