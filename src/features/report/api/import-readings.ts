import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { reportKeys } from "@/lib/query-keys";
import type { ImportMapping, ImportResult } from "./types";

export interface ImportReadingsInput {
  file: File;
  roomId: number;
  /** The mapping as the person checked it; without one the server uses its own proposal. */
  mapping?: ImportMapping;
}

export function importReadings(caseId: number, { file, roomId, mapping }: ImportReadingsInput) {
  const body = new FormData();
  body.append("file", file, file.name);
  body.append("roomId", String(roomId));
  if (mapping) body.append("mapping", JSON.stringify(mapping));
  return api.post<ImportResult>(`/cases/${caseId}/readings/import`, body);
}

export function useImportReadings(caseId: number) {
  return useMutation({
    mutationKey: reportKeys.import(caseId),
    mutationFn: (input: ImportReadingsInput) => importReadings(caseId, input),
  });
}
