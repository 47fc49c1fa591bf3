import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WorkOrder } from "./types";
import { worksKeys } from "./works-keys";

/** The case's work orders; the tenant gets the same shape without the staff-only fields. */
export const getWorkOrders = (caseId: number, signal?: AbortSignal) => api.get<{ workOrders: WorkOrder[] }>(`/cases/${caseId}/work-orders`, { signal });

export const workOrdersQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: worksKeys.workOrders(caseId),
    queryFn: ({ signal }) => getWorkOrders(caseId, signal),
    select: (data) => data.workOrders,
  });

export function useWorkOrders(caseId: number) {
  return useQuery(workOrdersQueryOptions(caseId));
}
