import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { UserHistoryResponse } from "@/lib/contracts";
import { userKeys } from "@/lib/query-keys";

export const getUserHistory = (id: number, signal?: AbortSignal) =>
  api.get<UserHistoryResponse>(`/users/${id}/history`, { signal });

export const userHistoryQueryOptions = (id: number) =>
  queryOptions({ queryKey: userKeys.history(id), queryFn: ({ signal }) => getUserHistory(id, signal) });

export function useUserHistory(id: number) {
  return useQuery(userHistoryQueryOptions(id));
}
