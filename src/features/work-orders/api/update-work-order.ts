import { useMutation, useQueryClient } from "@tanstack/react-query";
import { patchWorkOrder } from "../lib/work-orders";
import { refreshWorks } from "./refresh-works";
import type { WorkOrder, WorkOrderPatch } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** Schedule or reschedule (409 when the operative is already booked), complete, or cancel. */
export const updateWorkOrder = (id: number, patch: WorkOrderPatch) => patchWorkOrder<WorkOrder>(id, patch);

export function useUpdateWorkOrder(caseId: number, workOrderId: number, what: "schedule" | "complete" | "cancel") {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.workOrders(caseId), workOrderId, what],
    mutationFn: (patch: WorkOrderPatch) => updateWorkOrder(workOrderId, patch),
    onSuccess: () => refreshWorks(queryClient, caseId),
  });
}
