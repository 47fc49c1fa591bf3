import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintRemedyResponse, ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

export type RemedyInput = ComplaintRemedyResponse & { version: number; note: string | null };

/** PUT /api/complaints/:id/remedy: apology, what will be put right, compensation (pence) and its dates. */
export const setRemedy = (id: number, input: RemedyInput) => api.put<ComplaintResponse>(`/complaints/${id}/remedy`, input);

export function useSetRemedy(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RemedyInput) => setRemedy(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
