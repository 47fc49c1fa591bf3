import type { QueryClient } from "@tanstack/react-query";
import { workspaceKeys } from "./workspace-keys";

/**
 * After any change to a case: the case itself and everything that follows from it. The case key
 * is matched exactly so its readings and photos (which no change here touches) are not fetched again.
 */
export function refreshCaseWork(queryClient: QueryClient, id: number): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: workspaceKeys.case(id), exact: true }),
    queryClient.invalidateQueries({ queryKey: workspaceKeys.events(id) }),
    queryClient.invalidateQueries({ queryKey: workspaceKeys.deadlines(id) }),
    queryClient.invalidateQueries({ queryKey: workspaceKeys.triage(id) }),
    queryClient.invalidateQueries({ queryKey: workspaceKeys.inspections(id) }),
    queryClient.invalidateQueries({ queryKey: workspaceKeys.assessments(id) }),
  ]);
}
