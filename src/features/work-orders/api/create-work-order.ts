import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshWorks } from "./refresh-works";
import type { WorkOrder, WorkOrderInput } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** 409 unless the case is investigated or has works planned; the server's message says why. */
export const createWorkOrder = (caseId: number, input: WorkOrderInput) =>
  api.post<WorkOrder>(`/cases/${caseId}/work-orders`, input);

export function useCreateWorkOrder(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.workOrders(caseId), "create"],
    mutationFn: (input: WorkOrderInput) => createWorkOrder(caseId, input),
    onSuccess: () => refreshWorks(queryClient, caseId),
  });
}
