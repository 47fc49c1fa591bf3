import { Fragment, useId, type ReactNode } from "react";
import {
  columnVisibilityFeature,
  createColumnHelper,
  rowPaginationFeature,
  rowSelectionFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type ColumnDef,
  type ColumnVisibilityState,
  type PaginationState,
  type ReactTable,
  type RowData,
  type RowSelectionState,
  type SortingState,
  type Updater,
} from "@tanstack/react-table";
import { cn } from "@/lib/cn";
import { Alert } from "./alert";
import { Button } from "./button";
import { EmptyState } from "./empty-state";
import { Spinner } from "./spinner";

/**
 * Every Dewline table is paginated on the server: the table only renders the page it is given.
 * Sorting (on the server too), column hiding and row selection are there for the tables that ask
 * for them in useServerTable; a table that does not gets none of them.
 */
export const dataTableFeatures = tableFeatures({
  rowPaginationFeature,
  rowSortingFeature,
  columnVisibilityFeature,
  rowSelectionFeature,
});
export type DataTableFeatures = typeof dataTableFeatures;
export type DataTableInstance<Row extends RowData> = ReactTable<DataTableFeatures, Row>;

/** Column helper bound to our table features. */
export const dataTableColumnHelper = <Row extends RowData>() => createColumnHelper<DataTableFeatures, Row>();

export const PAGE_SIZE_OPTIONS = [10, 25, 50, 100] as const;

interface UseServerTableOptions<Row extends RowData> {
  // Columns of different value types in one array: TanStack Table's own typing for this is `any`.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<DataTableFeatures, Row, any>[];
  data: readonly Row[];
  rowCount: number | undefined;
  pagination: PaginationState;
  onPaginationChange: (next: PaginationState) => void;
  getRowId?: (row: Row) => string;
  /** Server-side sorting, owned by the caller; without it no column is sortable. */
  sorting?: SortingState;
  onSortingChange?: (next: SortingState) => void;
  /** Which columns are hidden ({ id: false }), owned by the caller. */
  columnVisibility?: ColumnVisibilityState;
  onColumnVisibilityChange?: (next: ColumnVisibilityState) => void;
  /** Selected row ids, owned by the caller; without it rows cannot be selected. */
  rowSelection?: RowSelectionState;
  onRowSelectionChange?: (next: RowSelectionState) => void;
}

const resolve = <T,>(updater: Updater<T>, current: T): T =>
  typeof updater === "function" ? (updater as (old: T) => T)(current) : updater;

/** A v9 table with manual (server-side) pagination whose page state is owned by the caller (the URL). */
export function useServerTable<Row extends RowData>({
  columns,
  data,
  rowCount,
  pagination,
  onPaginationChange,
  getRowId,
  sorting,
  onSortingChange,
  columnVisibility,
  onColumnVisibilityChange,
  rowSelection,
  onRowSelectionChange,
}: UseServerTableOptions<Row>) {
  return useTable({
    features: dataTableFeatures,
    columns,
    data,
    ...(getRowId ? { getRowId: (row: Row) => getRowId(row) } : {}),
    manualPagination: true,
    rowCount: rowCount ?? 0,
    // One column at a time, sorted by the server; a sorted column flips between asc and desc.
    manualSorting: true,
    enableSorting: sorting !== undefined,
    enableMultiSort: false,
    enableSortingRemoval: false,
    enableRowSelection: rowSelection !== undefined,
    state: {
      pagination,
      ...(sorting ? { sorting } : {}),
      ...(columnVisibility ? { columnVisibility } : {}),
      ...(rowSelection ? { rowSelection } : {}),
    },
    onPaginationChange: (updater: Updater<PaginationState>) => {
      onPaginationChange(resolve(updater, pagination));
    },
    ...(sorting && onSortingChange
      ? { onSortingChange: (updater: Updater<SortingState>) => onSortingChange(resolve(updater, sorting)) }
      : {}),
    ...(columnVisibility && onColumnVisibilityChange
      ? {
          onColumnVisibilityChange: (updater: Updater<ColumnVisibilityState>) =>
            onColumnVisibilityChange(resolve(updater, columnVisibility)),
        }
      : {}),
    ...(rowSelection && onRowSelectionChange
      ? { onRowSelectionChange: (updater: Updater<RowSelectionState>) => onRowSelectionChange(resolve(updater, rowSelection)) }
      : {}),
  });
}

/** The aria-sort value for a column header: only sortable columns carry one. */
function ariaSort(column: { getCanSort: () => boolean; getIsSorted: () => false | "asc" | "desc" }) {
  if (!column.getCanSort()) return undefined;
  const sorted = column.getIsSorted();
  return sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none";
}

interface DataTableProps<Row extends RowData> {
  table: DataTableInstance<Row>;
  /** The table's accessible name, shown as its caption unless hideCaption. */
  caption: string;
  hideCaption?: boolean;
  /** True before the first page has arrived. */
  loading?: boolean;
  /** True while another page is being fetched (the old one stays visible). */
  fetching?: boolean;
  error?: ReactNode;
  empty?: ReactNode;
  /** What the rows are, for "Showing 1–25 of 80 homes". */
  noun?: { one: string; many: string };
  pageSizeOptions?: readonly number[];
  className?: string;
  /** Content shown under a row across every column (an expanded row); null or undefined for none. */
  renderDetail?: (row: Row) => ReactNode;
  /** "compact": one tight line a row, for long work lists (the case queue). */
  density?: "comfortable" | "compact";
  /**
   * Keeps the leading columns in view when the table scrolls sideways (a tick box, the row's name):
   * one class list per column giving its left offset and, but for the last, its fixed width
   * (["left-0 w-8 min-w-8", "left-8"]).
   */
  stickyColumns?: readonly string[];
}

// A sticky cell needs a solid background of its own, the same as its row's, or the cells that
// scroll under it would show through.
const stickyCell = "sticky z-[1] bg-surface group-even:bg-paper group-hover:bg-dew-50 group-data-selected:bg-dew-50";

export interface SortableColumn {
  getIsSorted: () => false | "asc" | "desc";
  getToggleSortingHandler: () => undefined | ((event: unknown) => void);
}

/** A column heading that sorts a server-side table; the <th> carries aria-sort (DataTable). */
export function SortButton({ column, children }: { column: SortableColumn; children: ReactNode }) {
  const sorted = column.getIsSorted();
  return (
    <button
      type="button"
      onClick={column.getToggleSortingHandler()}
      className="-mx-1 inline-flex items-center gap-1 rounded-sm px-1 py-0.5 font-bold whitespace-nowrap hover:bg-dew-100"
    >
      {children}
      <svg viewBox="0 0 12 16" className={cn("size-3.5 shrink-0", sorted ? "text-ink" : "text-ink-soft")} aria-hidden="true">
        <path
          d="M6 2 10 6.5H2z"
          fill={sorted === "asc" ? "currentColor" : "none"}
          stroke="currentColor"
          strokeWidth="1.2"
          strokeLinejoin="round"
        />
        <path
          d="M6 14 2 9.5h8z"
          fill={sorted === "desc" ? "currentColor" : "none"}
          stroke="currentColor"
          strokeWidth="1.2"
          strokeLinejoin="round"
        />
      </svg>
    </button>
  );
}

/** The table's failed-to-load message with the server's words and a retry. */
export function TableLoadError({ title, message, onRetry }: { title: string; message: string; onRetry: () => void }) {
  return (
    <Alert tone="danger" title={title}>
      <p>{message}</p>
      <Button size="sm" variant="secondary" className="mt-2" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}

export function DataTable<Row extends RowData>({
  table,
  caption,
  hideCaption,
  loading = false,
  fetching = false,
  error,
  empty,
  noun = { one: "row", many: "rows" },
  pageSizeOptions = PAGE_SIZE_OPTIONS,
  className,
  renderDetail,
  density = "comfortable",
  stickyColumns = [],
}: DataTableProps<Row>) {
  const compact = density === "compact";
  const cellPad = compact ? "px-2 py-1" : "px-3 py-2";
  const striped = stickyColumns.length > 0 ? "even:bg-paper" : "even:bg-paper/60";
  const sticky = (index: number) => (index < stickyColumns.length ? cn(stickyCell, stickyColumns[index]) : undefined);
  const headerGroups = table.getHeaderGroups();
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length;

  let body: ReactNode;
  if (loading) {
    body = (
      <tr>
        <td colSpan={columnCount} className="px-3 py-6">
          <div role="status" className="flex items-center gap-2 text-ink-soft">
            <Spinner size="sm" label="" /> Loading {noun.many}…
          </div>
        </td>
      </tr>
    );
  } else if (error) {
    body = (
      <tr>
        <td colSpan={columnCount} className="px-3 py-4">
          {error}
        </td>
      </tr>
    );
  } else if (rows.length === 0) {
    body = (
      <tr>
        <td colSpan={columnCount} className="p-3">
          {empty ?? <EmptyState title={`No ${noun.many} to show`} />}
        </td>
      </tr>
    );
  } else {
    body = rows.map((row) => {
      const detail = renderDetail?.(row.original);
      return (
        <Fragment key={row.id}>
          <tr
            data-selected={row.getIsSelected() || undefined}
            className={cn(
              "group border-t border-line hover:bg-dew-50",
              striped,
              row.getIsSelected() && "bg-dew-50 even:bg-dew-50",
            )}
          >
            {row.getVisibleCells().map((cell, index) => (
              <td key={cell.id} className={cn(cellPad, compact ? "align-middle" : "align-top", sticky(index))}>
                <table.FlexRender cell={cell} />
              </td>
            ))}
          </tr>
          {detail ? (
            <tr className="bg-paper/60">
              <td colSpan={columnCount} className="px-3 pt-1 pb-3">
                {detail}
              </td>
            </tr>
          ) : null}
        </Fragment>
      );
    });
  }

  return (
    <div className={cn("flex flex-col gap-3", className)}>
      {/* Focusable so keyboard users can scroll a wide table sideways on a small screen. */}
      <div
        role="region"
        aria-label={`${caption} (scrolls sideways)`}
        tabIndex={0}
        className="relative overflow-x-auto rounded-md border border-line bg-surface"
      >
        <table className="w-full border-collapse text-left text-sm" aria-busy={loading || fetching || undefined}>
          <caption className={cn("px-3 pt-3 pb-1 text-left font-bold", hideCaption && "sr-only")}>{caption}</caption>
          <thead className="bg-dew-50 text-ink">
            {headerGroups.map((group) => (
              <tr key={group.id}>
                {group.headers.map((header, index) => (
                  <th
                    key={header.id}
                    scope="col"
                    colSpan={header.colSpan}
                    aria-sort={header.isPlaceholder ? undefined : ariaSort(header.column)}
                    className={cn(
                      "border-b border-line-strong font-bold whitespace-nowrap",
                      cellPad,
                      index < stickyColumns.length && cn("sticky z-[1] bg-dew-50", stickyColumns[index]),
                    )}
                  >
                    {header.isPlaceholder ? null : <table.FlexRender header={header} />}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>{body}</tbody>
        </table>
      </div>
      <Pagination table={table} noun={noun} pageSizeOptions={pageSizeOptions} fetching={fetching} disabled={loading} />
    </div>
  );
}

interface PaginationProps<Row extends RowData> {
  table: DataTableInstance<Row>;
  noun: { one: string; many: string };
  pageSizeOptions: readonly number[];
  fetching: boolean;
  disabled: boolean;
}

function Pagination<Row extends RowData>({ table, noun, pageSizeOptions, fetching, disabled }: PaginationProps<Row>) {
  const sizeId = useId();
  const { pageIndex, pageSize } = table.state.pagination;
  const total = table.getRowCount();
  const pageCount = Math.max(1, table.getPageCount());
  const first = total === 0 ? 0 : pageIndex * pageSize + 1;
  const last = Math.min(total, (pageIndex + 1) * pageSize);
  const sizes = pageSizeOptions.includes(pageSize) ? pageSizeOptions : [...pageSizeOptions, pageSize].sort((a, b) => a - b);

  return (
    <nav aria-label={`Pages of ${noun.many}`} className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <p aria-live="polite" className="text-ink-soft">
        {total === 0 ? `No ${noun.many}` : `Showing ${first}–${last} of ${total} ${total === 1 ? noun.one : noun.many}`}
        {fetching ? (
          <span className="ml-2 inline-flex items-center gap-1">
            <Spinner size="sm" label="" /> Updating…
          </span>
        ) : null}
      </p>
      <div className="flex flex-wrap items-center gap-2">
        <label htmlFor={sizeId} className="font-semibold">
          Rows per page
        </label>
        <select
          id={sizeId}
          value={pageSize}
          disabled={disabled}
          onChange={(e) => table.setPagination({ pageIndex: 0, pageSize: Number(e.target.value) })}
          className="min-h-8 rounded-md border border-line-strong bg-surface px-2"
        >
          {sizes.map((size) => (
            <option key={size} value={size}>
              {size}
            </option>
          ))}
        </select>
        <Button
          size="sm"
          variant="secondary"
          onClick={() => table.previousPage()}
          disabled={disabled || !table.getCanPreviousPage()}
        >
          <span aria-hidden="true">‹</span> Previous page
        </Button>
        <span className="px-1 whitespace-nowrap">
          Page {Math.min(pageIndex + 1, pageCount)} of {pageCount}
        </span>
        <Button size="sm" variant="secondary" onClick={() => table.nextPage()} disabled={disabled || !table.getCanNextPage()}>
          Next page <span aria-hidden="true">›</span>
        </Button>
      </div>
    </nav>
  );
}
