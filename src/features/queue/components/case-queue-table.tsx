import { useMemo, useState, type ReactNode } from "react";
import type { ColumnVisibilityState, RowSelectionState, SortingState } from "@tanstack/react-table";
import { Button } from "@/components/ui/button";
import { DataTable, TableLoadError, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { ExportLinks } from "@/components/ui/export-links";
import { errorMessage } from "@/lib/api-client";
import { useBulkUpdateCases } from "../api/bulk-update-cases";
import { useCaseQueue } from "../api/get-case-queue";
import { useStaff } from "@/lib/staff";
import type { BulkUpdate, QueueItem } from "../api/types";
import { useNow } from "../hooks/use-now";
import { useQueueTableParams } from "../hooks/use-queue-table-params";
import {
  DEFAULT_QUEUE_FILTERS,
  HIDEABLE_COLUMNS,
  QUEUE_SORTS,
  queueQuery,
  showsEverything,
  type HideableColumn,
  type QueueSort,
} from "../lib/queue-view";
import { BulkAssignDialog, BulkBar, BulkResult, BulkStatusDialog, type BulkOutcome } from "./bulk-actions";
import { ColumnMenu } from "./column-menu";
import { QueueFilters } from "./queue-filters";
import { queueColumns } from "./queue-columns";

const noRows: QueueItem[] = [];
/** The tick box (a fixed 2 rem) and the reference stay in view when the table scrolls sideways. */
const STICKY_COLUMNS = ["left-0 w-8 min-w-8", "left-8"] as const;

/** "works-planned" → "Works planned", for a page that does not pass its own words. */
const plainStatus = (status: string) => {
  const words = status.replace(/-/g, " ");
  return words.charAt(0).toUpperCase() + words.slice(1);
};

interface CaseQueueTableProps {
  /** Words for a status, used in the filter and the bulk dialog; the page passes the app's own. */
  statusLabel?: (status: string) => string;
  /** How a status shows in its cell (the page passes the shared status badge). */
  renderStatus?: (status: string) => ReactNode;
  /** The organisation's estates for the estate filter (GET /api/properties/estates). */
  estates?: readonly string[];
}

/**
 * The officers' case queue: filtered, sorted and paged on the server, every part of the view in
 * the URL, and bulk assignment and status changes for the ticked cases.
 */
export function CaseQueueTable({ statusLabel = plainStatus, renderStatus, estates }: CaseQueueTableProps) {
  const view = useQueueTableParams();
  const { params, hidden } = view;
  const queue = useCaseQueue(params);
  const staff = useStaff();
  const bulk = useBulkUpdateCases();
  const now = useNow();

  // Only an empty default view asks whether there are any cases at all, to say the right thing.
  const emptyDefault = !view.filtered && queue.isSuccess && queue.data.total === 0 && !queue.isPlaceholderData;
  const anyCase = useCaseQueue(
    { ...DEFAULT_QUEUE_FILTERS, status: "all", sort: "priority", order: "desc", page: 1, pageSize: 1 },
    { enabled: emptyDefault },
  );

  // The selection belongs to the rows on screen: a new filter, sort or page starts it afresh.
  const viewKey = JSON.stringify(params);
  const [rowSelection, setRowSelection] = useState<RowSelectionState>({});
  const [selectionView, setSelectionView] = useState(viewKey);
  if (selectionView !== viewKey) {
    setSelectionView(viewKey);
    setRowSelection({});
  }

  const [dialog, setDialog] = useState<"assign" | "status" | null>(null);
  const [outcome, setOutcome] = useState<BulkOutcome | null>(null);

  const columns = useMemo(
    () => queueColumns({ renderStatus: renderStatus ?? statusLabel, now }),
    [renderStatus, statusLabel, now],
  );
  const sorting: SortingState = useMemo(() => [{ id: params.sort, desc: params.order === "desc" }], [params.sort, params.order]);
  const columnVisibility: ColumnVisibilityState = useMemo(() => Object.fromEntries(hidden.map((id) => [id, false])), [hidden]);

  const table = useServerTable({
    columns,
    data: queue.data?.items ?? noRows,
    rowCount: queue.data?.total,
    pagination: { pageIndex: params.page - 1, pageSize: params.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => view.setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
    sorting,
    onSortingChange: (next) => {
      const first = next[0];
      if (first && (QUEUE_SORTS as readonly string[]).includes(first.id))
        view.setSort(first.id as QueueSort, first.desc ? "desc" : "asc");
    },
    columnVisibility,
    onColumnVisibilityChange: (next) => view.setHidden(HIDEABLE_COLUMNS.filter((id) => next[id] === false) as HideableColumn[]),
    rowSelection,
    onRowSelectionChange: setRowSelection,
  });

  const selected = table.getSelectedRowModel().rows.map((row) => row.original);

  const openDialog = (which: "assign" | "status") => {
    bulk.reset();
    setDialog(which);
  };
  const closeDialog = () => {
    bulk.reset();
    setDialog(null);
  };
  const run = (body: Omit<BulkUpdate, "ids">, change: string) => {
    bulk.mutate(
      { ids: selected.map((item) => item.id), ...body },
      {
        onSuccess: (result) => {
          setDialog(null);
          setOutcome({ change, result });
          setRowSelection({});
        },
      },
    );
  };
  const serverError = bulk.isError ? errorMessage(bulk.error) : null;

  let empty: ReactNode;
  if (showsEverything(params) || (emptyDefault && anyCase.data?.total === 0)) {
    empty = (
      <EmptyState title="No cases yet">
        When a tenant reports damp, condensation or mould, or a report is logged for them, it will appear here.
      </EmptyState>
    );
  } else if (!view.filtered) {
    empty = (
      <EmptyState
        title="No open cases"
        action={
          <Button variant="secondary" onClick={() => view.setStatus("all")}>
            Show all statuses
          </Button>
        }
      >
        Every case is closed or withdrawn. New reports will appear here.
      </EmptyState>
    );
  } else {
    empty = (
      <EmptyState
        title="No cases match these filters"
        action={
          <Button variant="secondary" onClick={view.clearFilters}>
            Clear filters
          </Button>
        }
      >
        Try fewer filters or a shorter search.
      </EmptyState>
    );
  }

  return (
    <div className="flex flex-col gap-3">
      <QueueFilters
        view={view}
        statusLabel={statusLabel}
        estates={estates}
        staff={staff.data}
        aside={
          <>
            <ColumnMenu table={table} onShowAll={() => view.setHidden([])} onReset={view.resetColumns} />
            <ExportLinks
              path="/cases/export"
              // The shown columns, in any order (the export keeps the screen's), or "none" for the reference alone.
              query={{ ...queueQuery(params), columns: HIDEABLE_COLUMNS.filter((c) => !hidden.includes(c)).join(",") || "none" }}
              what="cases in this view"
            />
          </>
        }
      />

      <BulkBar
        count={selected.length}
        onAssign={() => openDialog("assign")}
        onStatus={() => openDialog("status")}
        onClear={() => setRowSelection({})}
      />

      {outcome ? <BulkResult outcome={outcome} onDismiss={() => setOutcome(null)} /> : null}

      <DataTable
        table={table}
        caption="Case queue"
        hideCaption
        noun={{ one: "case", many: "cases" }}
        density="compact"
        stickyColumns={STICKY_COLUMNS}
        loading={queue.isPending}
        fetching={queue.isFetching && !queue.isPending}
        error={
          queue.isError ? (
            <TableLoadError
              title="We could not load the case queue"
              message={errorMessage(queue.error)}
              onRetry={() => void queue.refetch()}
            />
          ) : undefined
        }
        empty={empty}
      />

      <BulkAssignDialog
        open={dialog === "assign"}
        items={selected}
        staff={staff.data}
        busy={bulk.isPending}
        serverError={serverError}
        onCancel={closeDialog}
        onConfirm={(assigneeId, name) => run({ assigneeId }, assigneeId === null ? "unassigned" : `assigned to ${name}`)}
      />
      <BulkStatusDialog
        open={dialog === "status"}
        items={selected}
        statusLabel={statusLabel}
        busy={bulk.isPending}
        serverError={serverError}
        onCancel={closeDialog}
        onConfirm={(status, reason) => run({ status, ...(reason ? { reason } : {}) }, `moved to ${statusLabel(status)}`)}
      />
    </div>
  );
}
