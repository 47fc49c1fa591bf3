// The leads' changes to a sensor: register, new secret, revoke, remove. Each refreshes every sensor list
// and the sensor itself.
import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SensorCredentialsResponse, SensorResponse } from "@/lib/contracts";
import type { SensorCreateInput, SensorRemoveInput } from "@/lib/schemas/sensors";
import { sensorKeys } from "./sensor-keys";

export { sensorCreateSchema, type SensorCreateInput } from "@/lib/schemas/sensors";

const refresh = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: sensorKeys.all });

/** POST /api/sensors: the new sensor and its secret (this reply is the only time it is sent). */
export const registerSensor = (input: SensorCreateInput) => api.post<SensorCredentialsResponse>("/sensors", input);

export function useRegisterSensor() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: registerSensor, onSuccess: () => refresh(queryClient) });
}

/** POST /api/sensors/:id/credentials: a new secret; the old one stops working at once. */
export const issueSensorCredentials = (id: number) => api.post<SensorCredentialsResponse>(`/sensors/${id}/credentials`);

export function useIssueSensorCredentials() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: issueSensorCredentials, onSuccess: () => refresh(queryClient) });
}

/** POST /api/sensors/:id/revoke. */
export const revokeSensor = (id: number) => api.post<SensorResponse>(`/sensors/${id}/revoke`);

export function useRevokeSensor() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: revokeSensor, onSuccess: () => refresh(queryClient) });
}

/** POST /api/sensors/:id/remove. */
export const removeSensor = ({ id, ...input }: SensorRemoveInput & { id: number }) =>
  api.post<SensorResponse>(`/sensors/${id}/remove`, input);

export function useRemoveSensor() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: removeSensor, onSuccess: () => refresh(queryClient) });
}
