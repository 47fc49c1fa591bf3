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

/** The query string of GET /api/users (and of its export, which leaves the page out). */
export const usersQuery = (filters: UserListFilters) => ({
  role: filters.role || undefined,
  q: filters.q || undefined,
  page: filters.page,
  pageSize: filters.pageSize,
});

export const getUsers = (filters: UserListFilters, signal?: AbortSignal) =>
  api.get<UserPage>("/users", { query: usersQuery(filters), signal });

export const usersQueryOptions = (filters: UserListFilters) =>
  queryOptions({
    queryKey: userKeys.list(filters),
    queryFn: ({ signal }) => getUsers(filters, signal),
    placeholderData: keepPreviousData,
  });

export function useUsers(filters: UserListFilters) {
  return useQuery(usersQueryOptions(filters));
}
