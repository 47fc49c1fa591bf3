import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorReadingsResponse } from "@/lib/contracts";
import { SENSOR_REFETCH_MS } from "./get-sensor";
import { sensorKeys } from "./sensor-keys";

/** GET /api/sensors/:id/readings: the last `hours` up to now (the server's clock), averaged when long. */
export const getSensorReadings = (id: number, hours: number, signal?: AbortSignal) => {
  const to = new Date();
  const from = new Date(to.getTime() - hours * 3_600_000);
  return api.get<SensorReadingsResponse>(`/sensors/${id}/readings`, {
    query: { from: from.toISOString(), to: to.toISOString() },
    signal,
  });
};

export const sensorReadingsQueryOptions = (id: number, hours: number) =>
  queryOptions({
    queryKey: sensorKeys.readings(id, { hours }),
    queryFn: ({ signal }) => getSensorReadings(id, hours, signal),
    refetchInterval: SENSOR_REFETCH_MS,
    placeholderData: keepPreviousData,
  });

export function useSensorReadings(id: number, hours: number) {
  return useQuery(sensorReadingsQueryOptions(id, hours));
}
