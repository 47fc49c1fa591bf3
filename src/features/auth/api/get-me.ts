import { queryOptions, useQuery } from "@tanstack/react-query";
import { ApiError, api } from "@/lib/api-client";
import type { User } from "../roles";
import { authKeys } from "@/lib/query-keys";

/** The signed-in user, or null when nobody is signed in (a 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<User | null> {
  try {
    return await api.get<User>("/auth/me", { signal });
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}

/** The signed-in user inside the protected area, where the route guard has already made sure of it. */
export function useUser(): User {
  const { data } = useQuery(meQueryOptions());
  if (!data) throw new Error("useUser() was called outside the signed-in area.");
  return data;
}
