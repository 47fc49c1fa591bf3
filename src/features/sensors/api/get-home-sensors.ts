import { queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { api } from "@/lib/api-client";
import type { sensorListResponse } from "@/lib/contracts";
import { sensorKeys } from "./sensor-keys";

export type HomeSensors = z.infer<typeof sensorListResponse>;

/** GET /api/properties/:id/sensors: every sensor fitted in one home. */
export const homeSensorsQueryOptions = (propertyId: number) =>
  queryOptions({
    queryKey: sensorKeys.home(propertyId),
    queryFn: ({ signal }) => api.get<HomeSensors>(`/properties/${propertyId}/sensors`, { signal }),
  });

export function useHomeSensors(propertyId: number) {
  return useQuery(homeSensorsQueryOptions(propertyId));
}
