import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { MyHomeResponse } from "@/lib/contracts";
import { myHomeKeys } from "@/lib/query-keys";

export type MyHome = MyHomeResponse;

export const getMyHome = (signal?: AbortSignal) => api.get<MyHome>("/me/home", { signal });

export const myHomeQueryOptions = () =>
  queryOptions({
    queryKey: myHomeKeys.current(),
    queryFn: ({ signal }) => getMyHome(signal),
  });

export function useMyHome() {
  return useQuery(myHomeQueryOptions());
}
