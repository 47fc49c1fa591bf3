import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

export interface RespondInput {
  version: number;
  response: string;
  note: string | null;
}

/** POST /api/complaints/:id/respond: the stage's response (at stage 2 the final response, which closes it). */
export const respondComplaint = (id: number, input: RespondInput) =>
  api.post<ComplaintResponse>(`/complaints/${id}/respond`, input);

export function useRespondComplaint(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RespondInput) => respondComplaint(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
