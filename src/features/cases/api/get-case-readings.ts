import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CaseReading } from "./types";

/** Up to 50 000 readings, oldest first; all rooms unless one is named. */
export const getCaseReadings = (id: number, roomId?: number, signal?: AbortSignal) =>
  api.get<{ readings: CaseReading[] }>(`/cases/${id}/readings`, { query: { roomId }, signal });

export const caseReadingsQueryOptions = (id: number, roomId?: number) =>
  queryOptions({
    queryKey: caseKeys.readings(id, roomId),
    queryFn: ({ signal }) => getCaseReadings(id, roomId, signal),
    select: (data) => data.readings,
  });

export function useCaseReadings(id: number, roomId?: number) {
  return useQuery(caseReadingsQueryOptions(id, roomId));
}
