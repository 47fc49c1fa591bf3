import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ComplaintListResponse } from "@/lib/contracts";
import { caseKeys } from "@/lib/query-keys";

/** GET /api/cases/:id/complaints: the case's formal complaints with their clocks, newest first. */
export const getComplaints = (caseId: number, signal?: AbortSignal) =>
  api.get<ComplaintListResponse>(`/cases/${caseId}/complaints`, { signal });

export const complaintsQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: caseKeys.complaints(caseId),
    queryFn: ({ signal }) => getComplaints(caseId, signal),
  });

export function useComplaints(caseId: number) {
  return useQuery(complaintsQueryOptions(caseId));
}
