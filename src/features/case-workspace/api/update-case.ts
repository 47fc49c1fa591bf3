import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshCaseWork } from "./refresh-case";
import type { CasePatch, WorkspaceCase } from "./types";
import { caseKeys } from "@/lib/query-keys";

/** A status move, an assignment or a hazard classification. 409 when the workflow does not allow the move. */
export const updateCase = (id: number, patch: CasePatch) => api.patch<WorkspaceCase>(`/cases/${id}`, patch);

export function useUpdateCase(id: number, what: "status" | "assignee" | "hazard") {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.detail(id), "update", what],
    mutationFn: (patch: CasePatch) => updateCase(id, patch),
    onSuccess: () => refreshCaseWork(queryClient, id),
  });
}
