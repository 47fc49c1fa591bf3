// The landlord's active staff (GET /api/staff): who a case can be assigned to. Shared by the queue
// and the case workspace, under one query key, so both read the same shape from the cache.
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { StaffMember } from "@/lib/contracts";

export type { StaffMember };

export const staffKeys = { all: ["staff"] as const };

export const getStaff = async (signal?: AbortSignal): Promise<StaffMember[]> => (await api.get<{ users: StaffMember[] }>("/staff", { signal })).users;

export const staffQueryOptions = () =>
  queryOptions({
    queryKey: staffKeys.all,
    queryFn: ({ signal }) => getStaff(signal),
    staleTime: 5 * 60_000,
  });

export function useStaff() {
  return useQuery(staffQueryOptions());
}
