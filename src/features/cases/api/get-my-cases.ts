import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { CaseDto } from "./types";

export const getMyCases = (signal?: AbortSignal) => api.get<{ items: CaseDto[] }>("/me/cases", { signal });

export const myCasesQueryOptions = () =>
  queryOptions({
    queryKey: caseKeys.mine(),
    queryFn: ({ signal }) => getMyCases(signal),
    select: (data) => data.items,
  });

export function useMyCases() {
  return useQuery(myCasesQueryOptions());
}
