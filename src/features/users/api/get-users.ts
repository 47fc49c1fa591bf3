import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ManagedUser } from "./types";
import { userKeys } from "@/lib/query-keys";

export interface UserListFilters {
  role: string;
  q: string;
  page: number;
  pageSize: number;
}

export interface UserPage {
  items: ManagedUser[];
  total: number;
  page: number;
  pageSize: number;
}

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
