import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

export interface AcknowledgeInput {
  version: number;
  note: string | null;
}

/** POST /api/complaints/:id/acknowledge: the stage's acknowledgement (the tenant is sent the letter). */
export const acknowledgeComplaint = (id: number, input: AcknowledgeInput) =>
  api.post<ComplaintResponse>(`/complaints/${id}/acknowledge`, input);

export function useAcknowledgeComplaint(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AcknowledgeInput) => acknowledgeComplaint(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
