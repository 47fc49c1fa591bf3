/**
 * Keys for the works of one case. They sit under the case's own key (`["cases", "detail", id]`,
 * as in the cases feature and the workspace), so refreshing a case refreshes its works too. The
 * photos key is the case photos' key: work-order photos are among the case's photos.
 */
export const worksKeys = {
  case: (id: number) => ["cases", "detail", id] as const,
  events: (id: number) => [...worksKeys.case(id), "events"] as const,
  photos: (id: number) => [...worksKeys.case(id), "photos"] as const,
  triage: (id: number) => [...worksKeys.case(id), "triage"] as const,
  deadlines: (id: number) => [...worksKeys.case(id), "deadlines"] as const,
  workOrders: (id: number) => [...worksKeys.case(id), "work-orders"] as const,
  verification: (id: number) => [...worksKeys.case(id), "verification"] as const,
  /** The /works page's lists of work orders across cases. */
  allWorkOrders: () => ["work-orders"] as const,
};
