import type { QueryClient } from "@tanstack/react-query";
import { caseKeys } from "@/lib/query-keys";

/**
 * After any change to a case: the case itself and everything that follows from it. The case key
 * is matched exactly so its readings and photos (which no change here touches) are not fetched again.
 */
export function refreshCaseWork(queryClient: QueryClient, id: number): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: caseKeys.detail(id), exact: true }),
    queryClient.invalidateQueries({ queryKey: caseKeys.events(id) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.deadlines(id) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.triage(id) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.inspections(id) }),
    queryClient.invalidateQueries({ queryKey: caseKeys.assessments(id) }),
  ]);
}
