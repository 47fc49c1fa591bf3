import { useEffect, useRef } from "react";
import { useSearchParams } from "react-router-dom";
import { usePatchSearchParams, type SearchPatch } from "@/lib/search-params";
import type { WorkOrderStatus, WorkOrderType } from "../api/types";
import { addDays, todayInLondon, mondayOf } from "../lib/week";
import {
  isOrdersFiltered,
  ORDER_FILTER_KEYS,
  ORDERS_DEFAULT_PAGE_SIZE,
  ORDERS_DEFAULT_SORT,
  orderViewFrom,
  statusParam,
  weekFrom,
  weekRange,
  type OrderSort,
  type SortOrder,
} from "../lib/works-view";

// Values equal to these are left out of the URL, so the default view is plain /works.
const defaults: SearchPatch = { sort: ORDERS_DEFAULT_SORT, order: "asc", page: 1, pageSize: ORDERS_DEFAULT_PAGE_SIZE };

/** The week on the board (?week=YYYY-MM-DD of its Monday; this week when absent). */
export function useWeekParam() {
  const [searchParams] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const thisWeek = mondayOf(todayInLondon());
  const monday = weekFrom(searchParams);
  // A second press before the page has caught up moves on from the week last asked for. The weeks
  // asked for wait here until the page shows them; a week nobody asked for (Back) forgets them.
  const asked = useRef<string[]>([]);
  useEffect(() => {
    const at = asked.current.indexOf(monday);
    asked.current = at === -1 ? [] : asked.current.slice(at + 1);
  }, [monday]);
  const go = (next: string) => {
    asked.current = [...asked.current, next];
    patch({ week: next === thisWeek ? null : next });
  };
  const from = () => asked.current.at(-1) ?? monday;
  return {
    monday,
    range: weekRange(monday),
    isThisWeek: monday === thisWeek,
    previous: () => go(addDays(from(), -7)),
    next: () => go(addDays(from(), 7)),
    thisWeek: () => go(thisWeek),
  };
}

/**
 * The orders table's state lives in the URL: status, type, assignee, sort and order, page and
 * pageSize. A new filter or sort starts again at page 1.
 */
export function useOrdersTableParams() {
  const [searchParams] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const params = orderViewFrom(searchParams);
  const filter = (change: SearchPatch) => patch({ ...change, page: 1 });
  return {
    params,
    filtered: isOrdersFiltered(params),
    setStatus: (status: WorkOrderStatus[]) => filter({ status: statusParam(status) }),
    setType: (type: WorkOrderType | "") => filter({ type }),
    setAssignee: (assignee: string) => filter({ assignee }),
    setSort: (sort: OrderSort, order: SortOrder) => filter({ sort, order }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
    clearFilters: () => filter(Object.fromEntries(ORDER_FILTER_KEYS.map((key) => [key, null]))),
  };
}

export type OrdersTableParams = ReturnType<typeof useOrdersTableParams>;
