// The queue's whole view (filters, sort, page, shown columns) as it is written in the URL, read
// back from it and sent to GET /api/cases. Pure functions, so a link always opens the same view.
import { CASE_STATUSES, type CaseStatus } from "@/lib/domain/case-workflow";
import { readPositiveInt, readString } from "@/lib/search-params";

export const QUEUE_DEFAULT_PAGE_SIZE = 25;
export const QUEUE_MAX_PAGE_SIZE = 200;

/** The sort keys GET /api/cases accepts; each sortable column has the same id. */
export const QUEUE_SORTS = [
  "reference",
  "address",
  "estate",
  "rooms",
  "awareAt",
  "channel",
  "risk",
  "mouldIndex",
  "area",
  "vulnerable",
  "band",
  "priority",
  "due",
  "status",
  "assignee",
] as const;
export type QueueSort = (typeof QUEUE_SORTS)[number];
export type SortOrder = "asc" | "desc";
export const QUEUE_DEFAULT_SORT: QueueSort = "priority";
/** The server's default order: most urgent first for priority, A to Z (or oldest first) for the rest. */
export const defaultOrder = (sort: QueueSort): SortOrder => (sort === "priority" ? "desc" : "asc");

/** Every column that can be hidden; the selection box and the reference always show. */
export const HIDEABLE_COLUMNS = QUEUE_SORTS.filter((id) => id !== "reference");
export type HideableColumn = Exclude<QueueSort, "reference">;

/**
 * The columns shown until someone chooses others: what an officer needs to pick the next case, and
 * narrow enough to fit a 1 280 px screen. The rest are one tick away in the column menu.
 */
export const DEFAULT_SHOWN_COLUMNS: readonly HideableColumn[] = ["priority", "address", "risk", "due", "status"];
/** The URL's value for "no optional column at all" (an empty value would mean "not chosen"). */
export const NO_COLUMNS = "none";

/** Shown columns in their canonical order, for the URL: null when they are the default ones. */
export function columnsParam(shown: readonly HideableColumn[]): string | null {
  const list = listParam(HIDEABLE_COLUMNS, shown);
  if (list === listParam(HIDEABLE_COLUMNS, DEFAULT_SHOWN_COLUMNS)) return null;
  return list ?? NO_COLUMNS;
}

/** A list of shown columns as written in the URL or kept in the browser; null when there is none. */
export function readColumns(raw: string | null): HideableColumn[] | null {
  if (raw === null) return null;
  const given = new Set(raw.split(",").map((v) => v.trim()));
  return HIDEABLE_COLUMNS.filter((c) => given.has(c));
}

export const QUEUE_RISKS = ["condensing", "mould-risk", "borderline", "dry", "unknown"] as const;
export type QueueRisk = (typeof QUEUE_RISKS)[number];
export const QUEUE_CATEGORIES = ["1", "2", "none"] as const;
export type QueueCategory = (typeof QUEUE_CATEGORIES)[number];
export const HHSRS_BANDS = ["A", "B", "C", "D", "E", "F", "G", "H", "I", "J"] as const;
export type HhsrsBand = (typeof HHSRS_BANDS)[number];
/** The "due within" choices offered; a link may carry any whole number of days from 1 to 365. */
export const DUE_WITHIN_CHOICES = [1, 2, 5, 10] as const;

export const OPEN_STATUSES: readonly CaseStatus[] = CASE_STATUSES.filter((s) => s !== "closed" && s !== "cancelled");

/** "open" (the default: everything but closed and cancelled), "all", or the statuses chosen. */
export type StatusFilter = "open" | "all" | CaseStatus[];

export interface QueueFilters {
  status: StatusFilter;
  risk: QueueRisk[];
  category: QueueCategory[];
  band: HhsrsBand[];
  estate: string;
  vulnerable: "" | "true" | "false";
  /** Past the next deadline; when set, dueWithin is not used. */
  overdue: boolean;
  dueWithin: number | null;
  /** "" (anyone), "me", "unassigned" or a user id. */
  assignee: string;
  q: string;
}

/** Everything one request for the queue depends on: its query key. */
export interface QueueListParams extends QueueFilters {
  sort: QueueSort;
  order: SortOrder;
  page: number;
  pageSize: number;
}

export interface QueueView {
  params: QueueListParams;
  /** The optional columns the link shows (cols=…), or null when the link does not say. */
  shown: HideableColumn[] | null;
}

export const DEFAULT_QUEUE_FILTERS: Readonly<QueueFilters> = Object.freeze({
  status: "open",
  risk: [],
  category: [],
  band: [],
  estate: "",
  vulnerable: "",
  overdue: false,
  dueWithin: null,
  assignee: "",
  q: "",
});

/** The URL keys of the filters (the same names the API uses), for "Clear filters". */
export const FILTER_KEYS = [
  "status",
  "risk",
  "category",
  "band",
  "estate",
  "vulnerable",
  "overdue",
  "dueWithin",
  "assignee",
  "q",
] as const;

const oneOf = <T extends string>(values: readonly T[], value: string): value is T =>
  (values as readonly string[]).includes(value);

/** A comma list from the URL, keeping known values only, once each, in the canonical order. */
function readList<T extends string>(
  params: URLSearchParams,
  key: string,
  values: readonly T[],
  normalise = (v: string) => v,
): T[] {
  const raw = params.get(key);
  if (!raw) return [];
  const given = new Set(raw.split(",").map((v) => normalise(v.trim())));
  return values.filter((v) => given.has(v));
}

/** Chosen values in their canonical order, as one comma list for the URL. */
export function listParam<T extends string>(values: readonly T[], chosen: readonly T[]): string | null {
  const set = new Set(chosen);
  const list = values.filter((v) => set.has(v));
  return list.length ? list.join(",") : null;
}

/** The status filter in its shortest form: a list that is exactly the open ones is "open". */
export function normaliseStatus(status: StatusFilter): StatusFilter {
  if (status === "open" || status === "all") return status;
  const set = new Set(status);
  const list = CASE_STATUSES.filter((s) => set.has(s));
  if (list.length === 0 || list.length === CASE_STATUSES.length) return "all";
  if (list.length === OPEN_STATUSES.length && OPEN_STATUSES.every((s) => set.has(s))) return "open";
  return list;
}

export const statusParam = (status: StatusFilter): string => {
  const s = normaliseStatus(status);
  return typeof s === "string" ? s : s.join(",");
};

/** The statuses a filter lets through, for ticking its boxes. */
export const statusesOf = (status: StatusFilter): readonly CaseStatus[] =>
  status === "open" ? OPEN_STATUSES : status === "all" ? CASE_STATUSES : status;

function readStatus(params: URLSearchParams): StatusFilter {
  const raw = readString(params, "status").toLowerCase();
  if (!raw || raw === "open") return "open";
  if (raw === "all") return "all";
  const list = readList(params, "status", CASE_STATUSES, (v) => v.toLowerCase());
  return list.length ? normaliseStatus(list) : "open";
}

function readAssignee(params: URLSearchParams): string {
  const raw = readString(params, "assignee").toLowerCase();
  return raw === "me" || raw === "unassigned" || /^[1-9]\d*$/.test(raw) ? raw : "";
}

export function queueViewFrom(params: URLSearchParams): QueueView {
  const sortRaw = readString(params, "sort");
  const sort = oneOf(QUEUE_SORTS, sortRaw) ? sortRaw : QUEUE_DEFAULT_SORT;
  const orderRaw = readString(params, "order").toLowerCase();
  const order: SortOrder = orderRaw === "asc" || orderRaw === "desc" ? orderRaw : defaultOrder(sort);
  const vulnerableRaw = readString(params, "vulnerable").toLowerCase();
  const overdue = readString(params, "overdue").toLowerCase() === "true";
  const dueWithin = overdue || !params.has("dueWithin") ? null : readPositiveInt(params, "dueWithin", 0, 365) || null;
  return {
    params: {
      status: readStatus(params),
      risk: readList(params, "risk", QUEUE_RISKS, (v) => v.toLowerCase()),
      category: readList(params, "category", QUEUE_CATEGORIES, (v) => v.toLowerCase()),
      band: readList(params, "band", HHSRS_BANDS, (v) => v.toUpperCase()),
      estate: readString(params, "estate"),
      vulnerable: vulnerableRaw === "true" || vulnerableRaw === "false" ? vulnerableRaw : "",
      overdue,
      dueWithin,
      assignee: readAssignee(params),
      q: readString(params, "q"),
      sort,
      order,
      page: readPositiveInt(params, "page", 1),
      pageSize: readPositiveInt(params, "pageSize", QUEUE_DEFAULT_PAGE_SIZE, QUEUE_MAX_PAGE_SIZE),
    },
    shown: readColumns(params.get("cols")),
  };
}

/** True when any filter differs from the default view (open cases, nothing else). */
export function isFiltered(filters: QueueFilters): boolean {
  return (
    normaliseStatus(filters.status) !== "open" ||
    filters.risk.length > 0 ||
    filters.category.length > 0 ||
    filters.band.length > 0 ||
    Boolean(filters.estate || filters.vulnerable || filters.assignee || filters.q) ||
    filters.overdue ||
    filters.dueWithin !== null
  );
}

/** True when only the status is "all" and nothing else narrows: an empty answer means no cases at all. */
export const showsEverything = (filters: QueueFilters): boolean =>
  normaliseStatus(filters.status) === "all" && !isFiltered({ ...filters, status: "open" });

/** The query string GET /api/cases is sent (empty values are left out by the API client). */
export function queueQuery(params: QueueListParams): Record<string, string | number | undefined> {
  const status = normaliseStatus(params.status);
  return {
    status: status === "all" ? undefined : statusParam(status),
    risk: listParam(QUEUE_RISKS, params.risk) ?? undefined,
    category: listParam(QUEUE_CATEGORIES, params.category) ?? undefined,
    band: listParam(HHSRS_BANDS, params.band) ?? undefined,
    estate: params.estate || undefined,
    vulnerable: params.vulnerable || undefined,
    overdue: params.overdue ? "true" : undefined,
    dueWithin: params.overdue ? undefined : (params.dueWithin ?? undefined),
    assignee: params.assignee || undefined,
    q: params.q || undefined,
    sort: params.sort,
    order: params.order,
    page: params.page,
    pageSize: params.pageSize,
  };
}
