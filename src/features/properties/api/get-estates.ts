import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { propertyKeys } from "@/lib/query-keys";

export const getEstates = async (signal?: AbortSignal) =>
  (await api.get<{ estates: string[] }>("/properties/estates", { signal })).estates;

export const estatesQueryOptions = () =>
  queryOptions({
    queryKey: propertyKeys.estates(),
    queryFn: ({ signal }) => getEstates(signal),
    staleTime: 10 * 60_000,
  });

export function useEstates() {
  return useQuery(estatesQueryOptions());
}
