import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { z } from "zod";
import type { propertyPageResponse } from "@/lib/contracts";
import { propertyKeys } from "@/lib/query-keys";

export interface PropertyListFilters {
  q: string;
  estate: string;
  page: number;
  pageSize: number;
}

export type PropertyPage = z.infer<typeof propertyPageResponse>;

/** The query string of GET /api/properties (and of its export, which leaves the page out). */
export const propertiesQuery = (filters: PropertyListFilters) => ({
  q: filters.q || undefined,
  estate: filters.estate || undefined,
  page: filters.page,
  pageSize: filters.pageSize,
});

export const getProperties = (filters: PropertyListFilters, signal?: AbortSignal) =>
  api.get<PropertyPage>("/properties", { query: propertiesQuery(filters), signal });

export const propertiesQueryOptions = (filters: PropertyListFilters) =>
  queryOptions({
    queryKey: propertyKeys.list(filters),
    queryFn: ({ signal }) => getProperties(filters, signal),
    // Keep the last page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });

export function useProperties(filters: PropertyListFilters, options: { enabled?: boolean } = {}) {
  return useQuery({ ...propertiesQueryOptions(filters), enabled: options.enabled ?? true });
}
