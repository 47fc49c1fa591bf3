import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshWorks } from "./refresh-works";
import type { WorkOrder } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

export type BookingResponseInput = { response: "confirm" } | { response: "another-slot"; reason: string };

/** The tenant's answer to the proposed appointment. */
export const respondToBooking = (workOrderId: number, input: BookingResponseInput) =>
  api.post<WorkOrder>(`/work-orders/${workOrderId}/booking-response`, input);

export function useRespondToBooking(caseId: number, workOrderId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.workOrders(caseId), workOrderId, "booking-response"],
    mutationFn: (input: BookingResponseInput) => respondToBooking(workOrderId, input),
    onSuccess: () => refreshWorks(queryClient, caseId),
  });
}
