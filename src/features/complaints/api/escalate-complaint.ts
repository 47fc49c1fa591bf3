import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

export interface EscalateInput {
  version: number;
  /** Why the tenant is still unhappy. */
  reason: string;
}

/** POST /api/complaints/:id/escalate: to stage 2, by the tenant or staff for them. */
export const escalateComplaint = (id: number, input: EscalateInput) =>
  api.post<ComplaintResponse>(`/complaints/${id}/escalate`, input);

export function useEscalateComplaint(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EscalateInput) => escalateComplaint(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
