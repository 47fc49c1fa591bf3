import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";

/** Why a missed deadline stage was missed (officers and admins; 409 for a stage not missed). */
export const explainMissedDeadline = (id: number, stage: string, reason: string) =>
  api.put<null>(`/cases/${id}/deadlines/${stage}/missed-reason`, { reason });

export function useExplainMissedDeadline(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ stage, reason }: { stage: string; reason: string }) => explainMissedDeadline(id, stage, reason),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: caseKeys.deadlines(id) }),
        queryClient.invalidateQueries({ queryKey: caseKeys.detail(id) }),
      ]),
  });
}
