import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorHealthSummaryResponse } from "@/lib/contracts";
import { sensorHealthKeys } from "./sensor-health-keys";

/** GET /api/sensor-health/summary: the landlord's sensors in use, counted by problem. */
export const getSensorHealthSummary = (signal?: AbortSignal) =>
  api.get<SensorHealthSummaryResponse>("/sensor-health/summary", { signal });

export const sensorHealthSummaryQueryOptions = () =>
  queryOptions({
    queryKey: sensorHealthKeys.summary(),
    queryFn: ({ signal }) => getSensorHealthSummary(signal),
    // Offline moves with the clock: look again every minute while the page is open.
    refetchInterval: 60_000,
  });

export function useSensorHealthSummary() {
  return useQuery(sensorHealthSummaryQueryOptions());
}
