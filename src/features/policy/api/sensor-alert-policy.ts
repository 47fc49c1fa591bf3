import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorAlertPolicyResponse } from "@/lib/contracts";
import { policyKeys } from "@/lib/query-keys";

export type SensorAlertRules = Omit<SensorAlertPolicyResponse, "source">;

/** GET /api/policy/sensor-alerts: the rules rooms' live sensor figures are judged by. */
export const getSensorAlertPolicy = (signal?: AbortSignal) =>
  api.get<SensorAlertPolicyResponse>("/policy/sensor-alerts", { signal });

export const sensorAlertPolicyQueryOptions = () =>
  queryOptions({ queryKey: policyKeys.sensorAlerts(), queryFn: ({ signal }) => getSensorAlertPolicy(signal) });

export function useSensorAlertPolicy() {
  return useQuery(sensorAlertPolicyQueryOptions());
}

/** PUT /api/policy/sensor-alerts. */
export function useUpdateSensorAlertPolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (rules: SensorAlertRules) => api.put<SensorAlertPolicyResponse>("/policy/sensor-alerts", rules),
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.sensorAlerts(), policy),
  });
}

/** DELETE /api/policy/sensor-alerts: our own defaults apply again. */
export function useResetSensorAlertPolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<SensorAlertPolicyResponse>("/policy/sensor-alerts"),
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.sensorAlerts(), policy),
  });
}
