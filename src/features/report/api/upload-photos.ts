import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { reportKeys } from "@/lib/query-keys";
import type { PhotoUploadResponse } from "@/lib/contracts";

/** Multipart, field `photos`: 1–10 files of up to 15 MB each; each is taken or refused on its own (`refused`). */
export function uploadPhotos(caseId: number, files: readonly File[], idempotencyKey?: string) {
  const body = new FormData();
  for (const file of files) body.append("photos", file, file.name);
  return api.post<PhotoUploadResponse>(`/cases/${caseId}/photos`, body, { idempotencyKey });
}

export function useUploadPhotos(caseId: number) {
  return useMutation({
    mutationKey: reportKeys.photos(caseId),
    mutationFn: (files: readonly File[]) => uploadPhotos(caseId, files),
  });
}
