import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WorkPhoto } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** The case's photos (the same request and key as the case's gallery); work-order photos carry workOrderId. */
export const getCasePhotos = (caseId: number, signal?: AbortSignal) => api.get<{ photos: WorkPhoto[] }>(`/cases/${caseId}/photos`, { signal });

export const workPhotosQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: caseKeys.photos(caseId),
    queryFn: ({ signal }) => getCasePhotos(caseId, signal),
    select: (data) => data.photos,
  });

export function useWorkPhotos(caseId: number) {
  return useQuery(workPhotosQueryOptions(caseId));
}

/** The photos of one work order, oldest first. */
export const photosOfOrder = (photos: readonly WorkPhoto[], workOrderId: number) => photos.filter((p) => p.workOrderId === workOrderId);
