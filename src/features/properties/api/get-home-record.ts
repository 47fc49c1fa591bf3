import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { z } from "zod";
import type { homeCasesResponse, homeReadingsResponse, homeTenantsResponse } from "@/lib/contracts";
import { propertyKeys } from "@/lib/query-keys";

export type HomeTenants = z.infer<typeof homeTenantsResponse>;
export type HomeCases = z.infer<typeof homeCasesResponse>;
export type HomeReadings = z.infer<typeof homeReadingsResponse>;

/** A home's tenancies, current first (GET /api/properties/:id/tenants). */
export const homeTenantsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: propertyKeys.tenants(id),
    queryFn: ({ signal }) => api.get<HomeTenants>(`/properties/${id}/tenants`, { signal }),
  });

export function useHomeTenants(id: number | undefined) {
  return useQuery({ ...homeTenantsQueryOptions(id ?? 0), enabled: id !== undefined && id > 0 });
}

/** A home's cases, open and closed (GET /api/properties/:id/cases). */
export const homeCasesQueryOptions = (id: number) =>
  queryOptions({
    queryKey: propertyKeys.cases(id),
    queryFn: ({ signal }) => api.get<HomeCases>(`/properties/${id}/cases`, { signal }),
  });

export function useHomeCases(id: number) {
  return useQuery(homeCasesQueryOptions(id));
}

/** Each room's latest readings (GET /api/properties/:id/readings). */
export const homeReadingsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: propertyKeys.readings(id),
    queryFn: ({ signal }) => api.get<HomeReadings>(`/properties/${id}/readings`, { signal }),
  });

export function useHomeReadings(id: number) {
  return useQuery(homeReadingsQueryOptions(id));
}
