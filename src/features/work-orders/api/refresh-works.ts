import type { QueryClient } from "@tanstack/react-query";
import { caseKeys, workOrderKeys } from "@/lib/query-keys";

/**
 * After any change to a work order or the verification: the case (its status follows the orders)
 * and everything that follows from it, and the /works page's lists. The case key is matched exactly
 * so its readings are not fetched again.
 */
export function refreshWorks(queryClient: QueryClient, caseId: number): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: caseKeys.detail(caseId), exact: true }),
    queryClient.invalidateQueries({ queryKey: caseKeys.events(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.deadlines(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.triage(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.workOrders(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.photos(caseId) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.verification(caseId) }),
    queryClient.invalidateQueries({ queryKey: workOrderKeys.all }),
  ]);
}
