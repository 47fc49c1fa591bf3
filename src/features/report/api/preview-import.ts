import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { reportKeys } from "@/lib/query-keys";
import type { ImportPreview } from "./types";

/** The server reads the start of the file and proposes which column is which. */
export function previewImport(caseId: number, file: File) {
  const body = new FormData();
  body.append("file", file, file.name);
  return api.post<ImportPreview>(`/cases/${caseId}/readings/import/preview`, body);
}

export function usePreviewImport(caseId: number) {
  return useMutation({ mutationKey: reportKeys.importPreview(caseId), mutationFn: (file: File) => previewImport(caseId, file) });
}
