import type { OrderListParams, WeekParams } from "../lib/works-view";

/**
 * Work orders live under ["work-orders"], so that invalidating that prefix after a change (here,
 * or in the case workspace) refreshes the board and the table together.
 */
export const worksKeys = {
  all: ["work-orders"] as const,
  lists: () => [...worksKeys.all, "list"] as const,
  list: (params: OrderListParams) => [...worksKeys.lists(), params] as const,
  weeks: () => [...worksKeys.all, "week"] as const,
  week: (week: WeekParams) => [...worksKeys.weeks(), week] as const,
};
