import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { StaffMember } from "./types";
import { workspaceKeys } from "./workspace-keys";

/** Active officers, maintenance leads and administrators of the landlord: who a case can be given to. */
export const getStaff = (signal?: AbortSignal) => api.get<{ users: StaffMember[] }>("/staff", { signal });

export const staffQueryOptions = () =>
  queryOptions({
    queryKey: workspaceKeys.staff(),
    queryFn: ({ signal }) => getStaff(signal),
    select: (data) => data.users,
    staleTime: 5 * 60_000,
  });

export function useStaff() {
  return useQuery(staffQueryOptions());
}
