import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ProactiveCaseResponse } from "@/lib/contracts";
import { caseKeys, sensorAlertKeys } from "@/lib/query-keys";

/** POST /api/sensor-alerts/:id/proactive-case: one case for the home, however many officers click. */
export const openProactiveCase = (alertId: number) => api.post<ProactiveCaseResponse>(`/sensor-alerts/${alertId}/proactive-case`);

export function useOpenProactiveCase() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: openProactiveCase,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: sensorAlertKeys.all });
      void queryClient.invalidateQueries({ queryKey: caseKeys.all });
    },
  });
}
