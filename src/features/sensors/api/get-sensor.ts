import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorResponse } from "@/lib/contracts";
import { sensorKeys } from "./sensor-keys";

/** How often a device page asks again: sensors report every few minutes at most. */
export const SENSOR_REFETCH_MS = 15_000;

export const getSensor = (id: number, signal?: AbortSignal) => api.get<SensorResponse>(`/sensors/${id}`, { signal });

/** GET /api/sensors/:id, refreshed every 15 s so "last seen" stays current. */
export const sensorQueryOptions = (id: number) =>
  queryOptions({
    queryKey: sensorKeys.detail(id),
    queryFn: ({ signal }) => getSensor(id, signal),
    refetchInterval: SENSOR_REFETCH_MS,
  });

export function useSensor(id: number) {
  return useQuery(sensorQueryOptions(id));
}
