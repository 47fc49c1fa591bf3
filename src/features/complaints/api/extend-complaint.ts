import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

export interface ExtendInput {
  version: number;
  workingDays: number;
  /** Told to the tenant. */
  reason: string;
  note: string | null;
}

/** POST /api/complaints/:id/extend: the stage's one extension. */
export const extendComplaint = (id: number, input: ExtendInput) => api.post<ComplaintResponse>(`/complaints/${id}/extend`, input);

export function useExtendComplaint(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ExtendInput) => extendComplaint(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
