import type { QueryClient } from "@tanstack/react-query";
import { worksKeys } from "./works-keys";

/**
 * After any change to a work order or the verification: the case (its status follows the orders)
 * and everything that follows from it, and the /works page's lists. The case key is matched exactly
 * so its readings are not fetched again.
 */
export function refreshWorks(queryClient: QueryClient, caseId: number): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: worksKeys.case(caseId), exact: true }),
    queryClient.invalidateQueries({ queryKey: worksKeys.events(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.deadlines(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.triage(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.workOrders(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.photos(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.verification(caseId) }),
    queryClient.invalidateQueries({ queryKey: worksKeys.allWorkOrders() }),
  ]);
}
