// The landlord's contractors (GET /api/contractors): who, besides the operatives, can be booked for
// a work order. Shared by the Works page and the case's works, under one query key.
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ContractorResponse } from "@/lib/contracts";
import { contractorKeys } from "@/lib/query-keys";

export type Contractor = ContractorResponse;

export const getContractors = async (signal?: AbortSignal): Promise<Contractor[]> =>
  (await api.get<{ contractors: Contractor[] }>("/contractors", { signal })).contractors;

export const contractorsQueryOptions = () =>
  queryOptions({
    queryKey: contractorKeys.list(),
    queryFn: ({ signal }) => getContractors(signal),
    staleTime: 5 * 60_000,
  });

export function useContractors(options: { enabled?: boolean } = {}) {
  return useQuery({ ...contractorsQueryOptions(), enabled: options.enabled ?? true });
}
