import type { QueryClient } from "@tanstack/react-query";
import { caseKeys } from "@/lib/query-keys";

/** After any complaint change: the complaints and the timeline (which holds its events and letters). */
export const refreshComplaints = (queryClient: QueryClient, caseId: number) =>
  Promise.all([
    queryClient.invalidateQueries({ queryKey: caseKeys.complaints(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.events(caseId) }),
  ]);
