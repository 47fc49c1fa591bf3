import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorAttentionPage, SensorProblemName } from "@/lib/contracts";
import { sensorHealthKeys } from "./sensor-health-keys";

export interface SensorAttentionFilters {
  problem: SensorProblemName | "";
  page: number;
  pageSize: number;
}

/** GET /api/sensor-health/devices: the sensors needing attention, by home. */
export const getSensorsNeedingAttention = (filters: SensorAttentionFilters, signal?: AbortSignal) =>
  api.get<SensorAttentionPage>("/sensor-health/devices", {
    query: { problem: filters.problem || undefined, page: filters.page, pageSize: filters.pageSize },
    signal,
  });

export const sensorsNeedingAttentionQueryOptions = (filters: SensorAttentionFilters) =>
  queryOptions({
    queryKey: sensorHealthKeys.list(filters),
    queryFn: ({ signal }) => getSensorsNeedingAttention(filters, signal),
    placeholderData: keepPreviousData,
    refetchInterval: 60_000,
  });

export function useSensorsNeedingAttention(filters: SensorAttentionFilters) {
  return useQuery(sensorsNeedingAttentionQueryOptions(filters));
}
