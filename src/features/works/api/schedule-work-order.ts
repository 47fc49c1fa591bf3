import { useMutation, useQueryClient } from "@tanstack/react-query";
import { patchWorkOrder } from "@/lib/work-orders";
import type { ScheduleBody, WorkOrder } from "./types";
import { worksKeys } from "./works-keys";

export const scheduleWorkOrder = ({ id, body }: { id: number; body: ScheduleBody }) => patchWorkOrder<WorkOrder>(id, body);

export function useScheduleWorkOrder() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: scheduleWorkOrder,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: worksKeys.all }),
        // Booking the first order moves its case on (works planned), and adds to its timeline.
        queryClient.invalidateQueries({ queryKey: ["cases"] }),
      ]),
  });
}
