import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Inspection } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** Inspections of the case, oldest first. */
export const getInspections = (id: number, signal?: AbortSignal) =>
  api.get<{ inspections: Inspection[] }>(`/cases/${id}/inspections`, { signal });

export const inspectionsQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.inspections(id),
    queryFn: ({ signal }) => getInspections(id, signal),
    select: (data) => data.inspections,
  });

export function useInspections(id: number) {
  return useQuery(inspectionsQueryOptions(id));
}
