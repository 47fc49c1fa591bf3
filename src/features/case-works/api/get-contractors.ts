import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Contractor } from "./types";
import { worksKeys } from "./works-keys";

export const getContractors = (signal?: AbortSignal) => api.get<{ contractors: Contractor[] }>("/contractors", { signal });

export const contractorsQueryOptions = () =>
  queryOptions({
    queryKey: worksKeys.contractors(),
    queryFn: ({ signal }) => getContractors(signal),
    select: (data) => data.contractors,
    staleTime: 5 * 60_000,
  });

export function useContractors(options: { enabled?: boolean } = {}) {
  return useQuery({ ...contractorsQueryOptions(), enabled: options.enabled ?? true });
}
