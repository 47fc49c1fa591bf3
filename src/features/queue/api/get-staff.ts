import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { queueKeys } from "./queue-keys";
import type { StaffMember } from "./types";

export const getStaff = async (signal?: AbortSignal) => (await api.get<{ users: StaffMember[] }>("/staff", { signal })).users;

export const staffQueryOptions = () =>
  queryOptions({
    queryKey: queueKeys.staff(),
    queryFn: ({ signal }) => getStaff(signal),
    staleTime: 5 * 60_000,
  });

export function useStaff() {
  return useQuery(staffQueryOptions());
}
