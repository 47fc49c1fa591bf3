import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

/** POST /api/cases/:id/complaints: a formal complaint, in the tenant's words. */
export const raiseComplaint = (caseId: number, description: string) =>
  api.post<ComplaintResponse>(`/cases/${caseId}/complaints`, { description });

export function useRaiseComplaint(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (description: string) => raiseComplaint(caseId, description),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
