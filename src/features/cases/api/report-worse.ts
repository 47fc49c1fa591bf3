import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WorseResponse } from "@/lib/contracts";
import { caseKeys } from "@/lib/query-keys";

export const reportWorse = (id: number, note: string) => api.post<WorseResponse>(`/cases/${id}/worse`, { note });

/** "It's got worse": the timeline (and the case, whose status may move) refresh afterwards. */
export function useReportWorse(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.detail(id), "worse"],
    mutationFn: (note: string) => reportWorse(id, note),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: caseKeys.detail(id) }),
  });
}
