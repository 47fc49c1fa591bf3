import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { caseKeys } from "@/lib/query-keys";
import type { BulkUpdate, BulkUpdateResult } from "./types";

export const bulkUpdateCases = (body: BulkUpdate) => api.post<BulkUpdateResult>("/cases/bulk", body);

export function useBulkUpdateCases() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: bulkUpdateCases,
    // Some cases may have changed even when others failed: refresh the queue and every open case.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: caseKeys.all }),
  });
}
