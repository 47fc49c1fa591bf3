import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { DeadlinePolicy } from "./types";
import { workspaceKeys } from "./workspace-keys";

/** The landlord's deadline timeframes, or the England default when none are set. */
export const getPolicy = (signal?: AbortSignal) => api.get<DeadlinePolicy>("/policy", { signal });

export const policyQueryOptions = () =>
  queryOptions({
    queryKey: workspaceKeys.policy(),
    queryFn: ({ signal }) => getPolicy(signal),
    staleTime: 5 * 60_000,
  });

export function usePolicy() {
  return useQuery(policyQueryOptions());
}
