import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { OutlookResponse } from "@/lib/contracts";
import { myHomeKeys } from "@/lib/query-keys";

export type Outlook = OutlookResponse;

export const getMyOutlook = (signal?: AbortSignal) => api.get<Outlook>("/me/outlook", { signal });

export const myOutlookQueryOptions = () =>
  queryOptions({
    queryKey: myHomeKeys.outlook(),
    queryFn: ({ signal }) => getMyOutlook(signal),
    // The forecast moves by the hour; a fresh look every half hour is plenty.
    staleTime: 30 * 60_000,
  });

export function useMyOutlook() {
  return useQuery(myOutlookQueryOptions());
}
