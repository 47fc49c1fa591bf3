import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Property } from "@/lib/homes";
import { propertyKeys } from "@/lib/query-keys";

export const getProperty = (id: number, signal?: AbortSignal) => api.get<Property>(`/properties/${id}`, { signal });

export const propertyQueryOptions = (id: number) =>
  queryOptions({
    queryKey: propertyKeys.detail(id),
    queryFn: ({ signal }) => getProperty(id, signal),
  });

export function useProperty(id: number | undefined) {
  return useQuery({ ...propertyQueryOptions(id ?? 0), enabled: id !== undefined && id > 0 });
}
