import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CasePhoto } from "./types";

export const getCasePhotos = (id: number, signal?: AbortSignal) =>
  api.get<{ photos: CasePhoto[] }>(`/cases/${id}/photos`, { signal });

export const casePhotosQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.photos(id),
    queryFn: ({ signal }) => getCasePhotos(id, signal),
    select: (data) => data.photos,
  });

export function useCasePhotos(id: number) {
  return useQuery(casePhotosQueryOptions(id));
}
