// The Works page's view as it is written in the URL (the week on the board; the orders table's
// filters, sort and page), read back from it and sent to GET /api/work-orders. Pure functions.
import { readPositiveInt, readString } from "@/lib/search-params";
import { WORK_ORDER_STATUSES, WORK_ORDER_TYPES, type WorkOrderStatus, type WorkOrderType } from "../api/types";
import { addDays, isIsoDate, mondayOf, todayInLondon } from "./week";

export const ORDERS_DEFAULT_PAGE_SIZE = 25;
export const ORDERS_MAX_PAGE_SIZE = 200;

/** The sort keys GET /api/work-orders accepts; each sortable column has the same id. */
export const ORDER_SORTS = ["target", "slot", "created", "priority", "type", "status"] as const;
export type OrderSort = (typeof ORDER_SORTS)[number];
export type SortOrder = "asc" | "desc";
export const ORDERS_DEFAULT_SORT: OrderSort = "target";

/** Everything not done or cancelled: the table's default. */
export const OPEN_ORDER_STATUSES: readonly WorkOrderStatus[] = ["unscheduled", "scheduled", "change-requested", "confirmed"];
/** What the week board shows: every order with a slot that was not cancelled. */
export const BOOKED_STATUSES: readonly WorkOrderStatus[] = ["scheduled", "change-requested", "confirmed", "done"];

export interface OrderListParams {
  /** The statuses let through, in canonical order; never empty. */
  status: WorkOrderStatus[];
  type: WorkOrderType | "";
  /** "" (anyone), "me", "unassigned" or a user id. */
  assignee: string;
  sort: OrderSort;
  order: SortOrder;
  page: number;
  pageSize: number;
}

/** The URL keys of the table's filters, for "Clear filters". */
export const ORDER_FILTER_KEYS = ["status", "type", "assignee"] as const;

const oneOf = <T extends string>(values: readonly T[], value: string): value is T =>
  (values as readonly string[]).includes(value);

/** The chosen statuses in canonical order. */
export const canonicalStatuses = (chosen: readonly string[]): WorkOrderStatus[] =>
  WORK_ORDER_STATUSES.filter((s) => chosen.includes(s));

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((v) => b.includes(v));
export const isDefaultStatus = (status: readonly string[]) => sameSet(status, OPEN_ORDER_STATUSES);

/** The status list for the URL: nothing for the default (open orders). */
export function statusParam(status: readonly WorkOrderStatus[]): string | null {
  const list = canonicalStatuses(status);
  return list.length === 0 || isDefaultStatus(list) ? null : list.join(",");
}

function readAssignee(params: URLSearchParams): string {
  const raw = readString(params, "assignee").toLowerCase();
  return raw === "me" || raw === "unassigned" || /^[1-9]\d*$/.test(raw) ? raw : "";
}

export function orderViewFrom(params: URLSearchParams): OrderListParams {
  const statusList = canonicalStatuses(
    readString(params, "status")
      .toLowerCase()
      .split(",")
      .map((s) => s.trim()),
  );
  const typeRaw = readString(params, "type");
  const sortRaw = readString(params, "sort");
  const orderRaw = readString(params, "order").toLowerCase();
  return {
    status: statusList.length ? statusList : [...OPEN_ORDER_STATUSES],
    type: oneOf(WORK_ORDER_TYPES, typeRaw) ? typeRaw : "",
    assignee: readAssignee(params),
    sort: oneOf(ORDER_SORTS, sortRaw) ? sortRaw : ORDERS_DEFAULT_SORT,
    order: orderRaw === "desc" ? "desc" : "asc",
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", ORDERS_DEFAULT_PAGE_SIZE, ORDERS_MAX_PAGE_SIZE),
  };
}

export const isOrdersFiltered = (p: OrderListParams) => !isDefaultStatus(p.status) || p.type !== "" || p.assignee !== "";

/** The query string GET /api/work-orders is sent for the table. */
export function orderQuery(p: OrderListParams): Record<string, string | number | undefined> {
  return {
    status: p.status.length === WORK_ORDER_STATUSES.length ? undefined : canonicalStatuses(p.status).join(","),
    type: p.type || undefined,
    assignee: p.assignee || undefined,
    sort: p.sort,
    order: p.order,
    page: p.page,
    pageSize: p.pageSize,
  };
}

/** The Monday of the week in the URL (any date moves to its Monday), or of this week. */
export function weekFrom(params: URLSearchParams, today = todayInLondon()): string {
  const raw = readString(params, "week");
  return mondayOf(isIsoDate(raw) ? raw : today);
}

export interface WeekParams {
  from: string;
  to: string;
}

/** Monday to Sunday of a week, for GET /api/work-orders?from&to (the board shows a weekend day that holds work). */
export const weekRange = (monday: string): WeekParams => ({ from: monday, to: addDays(monday, 6) });

/** The board's request: every booked order in the week, in slot order, in one page. */
export function weekQuery(week: WeekParams): Record<string, string | number> {
  return {
    status: BOOKED_STATUSES.join(","),
    from: week.from,
    to: week.to,
    sort: "slot",
    order: "asc",
    page: 1,
    pageSize: ORDERS_MAX_PAGE_SIZE,
  };
}
