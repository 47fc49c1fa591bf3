import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { UserPageResponse } from "@/lib/contracts";
import { userKeys } from "@/lib/query-keys";

export interface UserListFilters {
  role: string;
  q: string;
  page: number;
  pageSize: number;
}

export type UserPage = UserPageResponse;

export const getUsers = (filters: UserListFilters, signal?: AbortSignal) =>
  api.get<UserPage>("/users", {
    query: { role: filters.role || undefined, q: filters.q || undefined, page: filters.page, pageSize: filters.pageSize },
    signal,
  });

export const usersQueryOptions = (filters: UserListFilters) =>
  queryOptions({
    queryKey: userKeys.list(filters),
    queryFn: ({ signal }) => getUsers(filters, signal),
    placeholderData: keepPreviousData,
  });

export function useUsers(filters: UserListFilters) {
  return useQuery(usersQueryOptions(filters));
}
