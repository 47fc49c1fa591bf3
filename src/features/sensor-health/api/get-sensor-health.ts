import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorHealthResponse } from "@/lib/contracts";
import { sensorHealthKeys } from "./sensor-health-keys";

/** GET /api/sensor-health/:id: one sensor's health, from its readings at the moment asked. */
export const getSensorHealth = (sensorId: number, signal?: AbortSignal) =>
  api.get<SensorHealthResponse>(`/sensor-health/${sensorId}`, { signal });

export const sensorHealthQueryOptions = (sensorId: number) =>
  queryOptions({
    queryKey: sensorHealthKeys.detail(sensorId),
    queryFn: ({ signal }) => getSensorHealth(sensorId, signal),
    refetchInterval: 60_000,
  });

export function useSensorHealth(sensorId: number) {
  return useQuery(sensorHealthQueryOptions(sensorId));
}
