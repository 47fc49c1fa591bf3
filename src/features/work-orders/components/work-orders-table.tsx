import { useCallback, useMemo, useState, type ReactNode } from "react";
import type { SortingState } from "@tanstack/react-table";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { DataTable, TableLoadError, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { ExportLinks } from "@/components/ui/export-links";
import { FanGuidance } from "./fan-guidance";
import { ScheduleDialog } from "./schedule-dialog";
import { errorMessage } from "@/lib/api-client";
import { useStaff } from "@/lib/staff";
import { useWorkOrders } from "../api/get-work-orders";
import type { WorkOrder } from "../api/types";
import { useOrdersTableParams } from "../hooks/use-works-params";
import { isFanWork } from "@/lib/extract-rates";
import { orderReference } from "../lib/labels";
import { todayInLondon } from "../lib/week";
import { ORDER_SORTS, orderQuery, type OrderSort } from "../lib/works-view";
import { detailId, ExpandedRowsContext, workOrderColumns } from "./work-order-columns";
import { WorkOrdersFilters } from "./work-orders-filters";

const noRows: WorkOrder[] = [];

function OrderDetails({ order }: { order: WorkOrder }) {
  return (
    <div id={detailId(order)} className="flex max-w-reading flex-col gap-2 text-sm">
      <p>
        <span className="font-semibold">The work: </span>
        {order.description}
      </p>
      {order.rooms.length ? (
        <p>
          <span className="font-semibold">Rooms: </span>
          {order.rooms.map((room) => room.name).join(", ")}
        </p>
      ) : null}
      {order.accessNotes ? (
        <p>
          <span className="font-semibold">Access and household: </span>
          {order.accessNotes}
        </p>
      ) : null}
      {order.booking?.response === "change-requested" && order.booking.reason ? (
        <p>
          <span className="font-semibold">The tenant asked for another slot: </span>“{order.booking.reason}”
        </p>
      ) : null}
      {isFanWork(order.type) ? <FanGuidance headingLevel={3} className="max-w-none" /> : null}
      <span className="sr-only">End of the details of {orderReference(order)}</span>
    </div>
  );
}

/**
 * Every work order of the landlord: filtered, sorted and paged on the server, the view in the URL.
 * Each open order can be booked or rebooked from its row.
 */
export function WorkOrdersTable() {
  const view = useOrdersTableParams();
  const { params } = view;
  const orders = useWorkOrders(params);
  const staff = useStaff();
  const today = todayInLondon();
  const [expanded, setExpanded] = useState<ReadonlySet<number>>(new Set());
  const [scheduling, setScheduling] = useState<WorkOrder | null>(null);
  const [booked, setBooked] = useState<WorkOrder | null>(null);

  const toggle = useCallback(
    (id: number) =>
      setExpanded((prev) => {
        const next = new Set(prev);
        if (next.has(id)) next.delete(id);
        else next.add(id);
        return next;
      }),
    [],
  );
  const expandedRows = useMemo(() => ({ expanded, toggle }), [expanded, toggle]);
  const columns = useMemo(
    () =>
      workOrderColumns({
        today,
        onSchedule: (order) => {
          setBooked(null);
          setScheduling(order);
        },
      }),
    [today],
  );
  const sorting: SortingState = useMemo(() => [{ id: params.sort, desc: params.order === "desc" }], [params.sort, params.order]);

  const table = useServerTable({
    columns,
    data: orders.data?.items ?? noRows,
    rowCount: orders.data?.total,
    pagination: { pageIndex: params.page - 1, pageSize: params.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => view.setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
    sorting,
    onSortingChange: (next) => {
      const first = next[0];
      if (first && (ORDER_SORTS as readonly string[]).includes(first.id))
        view.setSort(first.id as OrderSort, first.desc ? "desc" : "asc");
    },
  });

  let empty: ReactNode;
  if (view.filtered) {
    empty = (
      <EmptyState
        title="No orders match these filters"
        action={
          <Button variant="secondary" onClick={view.clearFilters}>
            Clear filters
          </Button>
        }
      >
        Try another status, type or person.
      </EmptyState>
    );
  } else {
    empty = (
      <EmptyState title="No work to schedule">
        When a housing officer asks for work on a home, the order appears here to book, and stays until it is done.
      </EmptyState>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <WorkOrdersFilters view={view} staff={staff.data} />
      <ExportLinks path="/work-orders/export" query={orderQuery(params)} what="work orders in this list" />
      {booked ? (
        <Alert tone="success" title={`${orderReference(booked)} is booked`}>
          The tenant is asked to confirm the slot.
        </Alert>
      ) : null}
      <ExpandedRowsContext value={expandedRows}>
        <DataTable
          table={table}
          caption="Work orders"
          hideCaption
          noun={{ one: "order", many: "orders" }}
          loading={orders.isPending}
          fetching={orders.isFetching && !orders.isPending}
          error={
            orders.isError ? (
              <TableLoadError
                title="We could not load the work orders"
                message={errorMessage(orders.error)}
                onRetry={() => void orders.refetch()}
              />
            ) : undefined
          }
          empty={empty}
          renderDetail={(order) => (expanded.has(order.id) ? <OrderDetails order={order} /> : null)}
        />
      </ExpandedRowsContext>
      <ScheduleDialog order={scheduling} onClose={() => setScheduling(null)} onScheduled={setBooked} />
    </div>
  );
}
