import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WorkOrder } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** The case's work orders; the tenant gets the same shape without the staff-only fields. */
export const getCaseWorkOrders = (caseId: number, signal?: AbortSignal) =>
  api.get<{ workOrders: WorkOrder[] }>(`/cases/${caseId}/work-orders`, { signal });

export const caseWorkOrdersQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: caseKeys.workOrders(caseId),
    queryFn: ({ signal }) => getCaseWorkOrders(caseId, signal),
    select: (data) => data.workOrders,
  });

export function useCaseWorkOrders(caseId: number) {
  return useQuery(caseWorkOrdersQueryOptions(caseId));
}
