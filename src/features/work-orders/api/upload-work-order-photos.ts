import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshWorks } from "./refresh-works";
import type { WorkPhoto } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** Multipart, field `photos`: the same pipeline as the case's photos. */
export function uploadWorkOrderPhotos(workOrderId: number, files: readonly File[]) {
  const body = new FormData();
  for (const file of files) body.append("photos", file, file.name);
  return api.post<{ photos: WorkPhoto[]; refused: { name: string; reason: string }[] }>(
    `/work-orders/${workOrderId}/photos`,
    body,
  );
}

export function useUploadWorkOrderPhotos(caseId: number, workOrderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.workOrders(caseId), workOrderId, "photos"],
    mutationFn: (files: readonly File[]) => uploadWorkOrderPhotos(workOrderId, files),
    onSuccess: () => refreshWorks(queryClient, caseId),
  });
}
