import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { reportKeys } from "@/lib/query-keys";
import type { HandReading, ReadingsAdded } from "./types";

export const addReadings = (caseId: number, readings: readonly HandReading[], idempotencyKey?: string) =>
  api.post<ReadingsAdded>(`/cases/${caseId}/readings`, readings, { idempotencyKey });

export function useAddReadings(caseId: number) {
  return useMutation({
    mutationKey: reportKeys.readings(caseId),
    mutationFn: (readings: readonly HandReading[]) => addReadings(caseId, readings),
  });
}
