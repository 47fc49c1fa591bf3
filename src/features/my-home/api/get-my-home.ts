import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Property } from "@/lib/homes";
import { myHomeKeys } from "@/lib/query-keys";

export interface MyHome {
  tenancy: { id: number; startDate: string; endDate: string | null };
  property: Property;
}

export const getMyHome = (signal?: AbortSignal) => api.get<MyHome>("/me/home", { signal });

export const myHomeQueryOptions = () =>
  queryOptions({
    queryKey: myHomeKeys.current(),
    queryFn: ({ signal }) => getMyHome(signal),
  });

export function useMyHome() {
  return useQuery(myHomeQueryOptions());
}
