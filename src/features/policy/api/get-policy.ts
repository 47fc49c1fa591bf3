import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { policyKeys } from "@/lib/query-keys";
import type { PolicyView } from "./types";

export const getPolicy = (signal?: AbortSignal) => api.get<PolicyView>("/policy", { signal });

export const policyQueryOptions = () =>
  queryOptions({
    queryKey: policyKeys.current(),
    queryFn: ({ signal }) => getPolicy(signal),
  });

export function usePolicy() {
  return useQuery(policyQueryOptions());
}
