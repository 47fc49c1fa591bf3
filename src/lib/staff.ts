// The landlord's active staff (GET /api/staff): who a case can be assigned to. Shared by the queue
// and the case workspace, under one query key, so both read the same shape from the cache.
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { StaffMember } from "@/lib/contracts";
import { staffKeys } from "@/lib/query-keys";

export type { StaffMember };

export const getStaff = async (signal?: AbortSignal): Promise<StaffMember[]> =>
  (await api.get<{ users: StaffMember[] }>("/staff", { signal })).users;

export const staffQueryOptions = () =>
  queryOptions({
    queryKey: staffKeys.list(),
    queryFn: ({ signal }) => getStaff(signal),
    staleTime: 5 * 60_000,
  });

export function useStaff() {
  return useQuery(staffQueryOptions());
}
