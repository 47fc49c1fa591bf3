import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { refreshComplaints } from "./refresh";

/** POST /api/complaints/:id/close: closed after the stage 1 response, when the tenant has not taken it further. */
export const closeComplaint = (id: number, input: { version: number; note: string | null }) =>
  api.post<ComplaintResponse>(`/complaints/${id}/close`, input);

export function useCloseComplaint(caseId: number, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { version: number; note: string | null }) => closeComplaint(id, input),
    onSettled: () => refreshComplaints(queryClient, caseId),
  });
}
