import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { InspectionRecorded } from "@/lib/contracts";
import { refreshCaseWork } from "./refresh-case";
import type { InspectionInput } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** Records what was found on site; the first inspection ends the investigation stage. */
export const recordInspection = (id: number, input: InspectionInput) =>
  api.post<InspectionRecorded>(`/cases/${id}/inspections`, input);

export function useRecordInspection(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.inspections(id), "record"],
    mutationFn: (input: InspectionInput) => recordInspection(id, input),
    onSuccess: () => refreshCaseWork(queryClient, id),
  });
}
