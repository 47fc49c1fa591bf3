import { useSearchParams } from "react-router-dom";
import { usePatchSearchParams, type SearchPatch } from "@/lib/search-params";
import {
  columnsParam,
  DEFAULT_SHOWN_COLUMNS,
  defaultOrder,
  FILTER_KEYS,
  HHSRS_BANDS,
  HIDEABLE_COLUMNS,
  isFiltered,
  listParam,
  QUEUE_CATEGORIES,
  QUEUE_DEFAULT_PAGE_SIZE,
  QUEUE_DEFAULT_SORT,
  QUEUE_RISKS,
  queueViewFrom,
  readColumns,
  statusParam,
  type HhsrsBand,
  type HideableColumn,
  type QueueCategory,
  type QueueRisk,
  type QueueSort,
  type SortOrder,
  type StatusFilter,
} from "../lib/queue-view";

// Values equal to these are left out of the URL, so the default view is plain /queue.
const defaults: SearchPatch = { status: "open", sort: QUEUE_DEFAULT_SORT, page: 1, pageSize: QUEUE_DEFAULT_PAGE_SIZE };

/** Where the browser keeps the officer's choice of columns, for the next visit. */
export const COLUMNS_STORAGE_KEY = "dewline.queue.columns";

function storedColumns(): HideableColumn[] | null {
  try {
    return readColumns(window.localStorage.getItem(COLUMNS_STORAGE_KEY));
  } catch {
    return null; // storage blocked: the default columns
  }
}

function storeColumns(shown: readonly HideableColumn[]) {
  try {
    window.localStorage.setItem(COLUMNS_STORAGE_KEY, shown.join(","));
  } catch {
    // storage blocked: the choice lasts as long as the link
  }
}

/** The deadline filter as one choice: any, overdue, or due within N days (overdue included). */
export type DeadlineChoice = "" | "overdue" | number;

/**
 * The whole state of the case queue lives in the URL: filters (status, risk, category, band,
 * estate, vulnerable, overdue or dueWithin, assignee, q), sort and order, page and pageSize, and
 * the shown columns when they are not the default ones (cols). A bookmarked or shared link opens
 * exactly the same view. A new filter or sort starts again at page 1. The choice of columns is also
 * kept in the browser, so a plain /queue opens with the columns the officer chose last.
 */
export function useQueueTableParams() {
  const [searchParams] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const view = queueViewFrom(searchParams);
  const { params } = view;
  const shown = view.shown ?? storedColumns() ?? DEFAULT_SHOWN_COLUMNS;
  const hidden = HIDEABLE_COLUMNS.filter((c) => !shown.includes(c));
  const filter = (change: SearchPatch, replace = false) => patch({ ...change, page: 1 }, { replace });

  return {
    params,
    hidden,
    filtered: isFiltered(params),
    deadline: (params.overdue ? "overdue" : (params.dueWithin ?? "")) as DeadlineChoice,
    setStatus: (status: StatusFilter) => filter({ status: statusParam(status) }),
    setRisk: (risk: QueueRisk[]) => filter({ risk: listParam(QUEUE_RISKS, risk) }),
    setCategory: (category: QueueCategory[]) => filter({ category: listParam(QUEUE_CATEGORIES, category) }),
    setBand: (band: HhsrsBand[]) => filter({ band: listParam(HHSRS_BANDS, band) }),
    setEstate: (estate: string) => filter({ estate }),
    setVulnerable: (vulnerable: "" | "true" | "false") => filter({ vulnerable }),
    setDeadline: (choice: DeadlineChoice) =>
      filter({ overdue: choice === "overdue" ? "true" : null, dueWithin: typeof choice === "number" ? choice : null }),
    setAssignee: (assignee: string) => filter({ assignee }),
    setSearch: (q: string) => filter({ q: q.trim() }, true),
    setSort: (sort: QueueSort, order: SortOrder) => filter({ sort, order: order === defaultOrder(sort) ? null : order }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
    // Showing or hiding a column is not a step worth going Back through.
    setHidden: (columns: readonly HideableColumn[]) => {
      const next = HIDEABLE_COLUMNS.filter((c) => !columns.includes(c));
      storeColumns(next);
      patch({ cols: columnsParam(next) }, { replace: true });
    },
    /** Back to the usual columns (DEFAULT_SHOWN_COLUMNS). */
    resetColumns: () => {
      storeColumns(DEFAULT_SHOWN_COLUMNS);
      patch({ cols: null }, { replace: true });
    },
    /** Back to open cases with no other filter; the sort, page size and columns stay as they are. */
    clearFilters: () => filter(Object.fromEntries(FILTER_KEYS.map((key) => [key, null]))),
  };
}

export type QueueTableParams = ReturnType<typeof useQueueTableParams>;
