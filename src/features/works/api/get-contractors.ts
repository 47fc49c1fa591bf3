import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Contractor } from "./types";
import { contractorKeys } from "./works-keys";

export const getContractors = async (signal?: AbortSignal): Promise<Contractor[]> =>
  (await api.get<{ contractors: Contractor[] }>("/contractors", { signal })).contractors;

export const contractorsQueryOptions = () =>
  queryOptions({
    queryKey: contractorKeys.list(),
    queryFn: ({ signal }) => getContractors(signal),
    staleTime: 5 * 60_000,
  });

export function useContractors() {
  return useQuery(contractorsQueryOptions());
}
