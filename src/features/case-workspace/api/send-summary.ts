import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshCaseWork } from "./refresh-case";
import type { SentSummary } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** The written summary to the tenant (409 before an inspection is recorded). */
export const sendSummary = (id: number, body: string) => api.post<SentSummary>(`/cases/${id}/summary`, { body });

export function useSendSummary(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.detail(id), "summary"],
    mutationFn: (body: string) => sendSummary(id, body),
    onSuccess: () => refreshCaseWork(queryClient, id),
  });
}
