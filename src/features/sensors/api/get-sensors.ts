import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { api } from "@/lib/api-client";
import type { sensorPageResponse } from "@/lib/contracts";
import { sensorKeys, type SensorListFilters } from "./sensor-keys";

export type SensorPage = z.infer<typeof sensorPageResponse>;

export const getSensors = (filters: SensorListFilters, signal?: AbortSignal) =>
  api.get<SensorPage>("/sensors", {
    query: { propertyId: filters.propertyId, state: filters.state || undefined, page: filters.page, pageSize: filters.pageSize },
    signal,
  });

/** GET /api/sensors: a page of the landlord's sensors, by home and state. */
export const sensorsQueryOptions = (filters: SensorListFilters) =>
  queryOptions({
    queryKey: sensorKeys.list(filters),
    queryFn: ({ signal }) => getSensors(filters, signal),
    placeholderData: keepPreviousData,
  });

export function useSensors(filters: SensorListFilters) {
  return useQuery(sensorsQueryOptions(filters));
}
