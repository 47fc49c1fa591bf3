import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { reportKeys } from "@/lib/query-keys";
import type { UploadedPhoto } from "./types";

/** Multipart, field `photos`: 1–10 files of up to 15 MB each. */
export function uploadPhotos(caseId: number, files: readonly File[]) {
  const body = new FormData();
  for (const file of files) body.append("photos", file, file.name);
  return api.post<{ photos: UploadedPhoto[] }>(`/cases/${caseId}/photos`, body);
}

export function useUploadPhotos(caseId: number) {
  return useMutation({
    mutationKey: reportKeys.photos(caseId),
    mutationFn: (files: readonly File[]) => uploadPhotos(caseId, files),
  });
}
