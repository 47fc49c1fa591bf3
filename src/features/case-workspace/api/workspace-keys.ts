/**
 * Keys for what the workspace reads about one case. They sit under the same prefix as the case
 * itself (`caseKeys.detail(id)` in the cases feature: a test checks they match), so refreshing a
 * case refreshes its workspace too.
 */
export const workspaceKeys = {
  case: (id: number) => ["cases", "detail", id] as const,
  events: (id: number) => [...workspaceKeys.case(id), "events"] as const,
  photos: (id: number) => [...workspaceKeys.case(id), "photos"] as const,
  triage: (id: number) => [...workspaceKeys.case(id), "triage"] as const,
  deadlines: (id: number) => [...workspaceKeys.case(id), "deadlines"] as const,
  inspections: (id: number) => [...workspaceKeys.case(id), "inspections"] as const,
  assessments: (id: number) => [...workspaceKeys.case(id), "assessments"] as const,
  related: (id: number) => [...workspaceKeys.case(id), "related"] as const,
  policy: () => ["policy"] as const,
};
