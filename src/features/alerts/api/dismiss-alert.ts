import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { sensorAlertKeys } from "@/lib/query-keys";

/** POST /api/sensor-alerts/:id/dismiss: the home's open alerts, with the officer's reason. */
export const dismissAlert = ({ alertId, reason }: { alertId: number; reason: string }) =>
  api.post<{ dismissed: number }>(`/sensor-alerts/${alertId}/dismiss`, { reason });

export function useDismissAlert() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: dismissAlert,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: sensorAlertKeys.all }),
  });
}
