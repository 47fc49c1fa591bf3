import { createContext, useContext, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { dataTableColumnHelper, SortButton, type SortableColumn } from "@/components/ui/data-table";
import { TextLink } from "@/components/ui/text-link";
import { formatDateTime } from "@/lib/dates";
import { cn } from "@/lib/cn";
import type { WorkOrder } from "../api/types";
import { labelFor, orderReference, priorityLabels, statusLabels, typeLabels, windowShortLabels } from "../lib/labels";
import { formatShortDate } from "../lib/week";
import type { OrderSort } from "../lib/works-view";
import { TenantAnswerText } from "./tenant-answer";

/** The headings of the sortable columns; their ids are the API's sort keys. */
export const SORT_LABELS: Record<OrderSort, string> = {
  type: "Type",
  priority: "Priority",
  target: "Target date",
  status: "Status",
  slot: "Slot",
  created: "Ordered",
};

const Missing = ({ children }: { children: ReactNode }) => <span className="text-ink-soft">{children}</span>;

const OPEN = ["unscheduled", "scheduled", "change-requested", "confirmed"];

/** The orders that can be booked or rebooked from the Works page: the open ones. */
const canSchedule = (order: Pick<WorkOrder, "status">) => OPEN.includes(order.status);
/** Scheduling again replaces a booking; an order with no slot is booked for the first time. */
const isReschedule = (order: Pick<WorkOrder, "slot">) => order.slot !== null;

/** Past its target date and not yet done: said in words with an icon, not by colour alone. */
export function TargetDate({ order, today }: { order: WorkOrder; today: string }) {
  const open = OPEN.includes(order.status);
  const late = open && order.targetDate < today;
  const dueToday = open && order.targetDate === today;
  return (
    <span className="flex flex-col whitespace-nowrap">
      <time dateTime={order.targetDate}>{formatShortDate(order.targetDate)}</time>
      {late ? (
        <span className="inline-flex items-center gap-1 font-bold text-rust-700">
          <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true">
            <circle cx="8" cy="8" r="7" fill="currentColor" />
            <path d="M8 4v5M8 11.2v.1" stroke="#fff" strokeWidth="1.8" strokeLinecap="round" />
          </svg>
          Late
        </span>
      ) : dueToday ? (
        <span className="font-semibold">Due today</span>
      ) : null}
    </span>
  );
}

const column = dataTableColumnHelper<WorkOrder>();

export const detailId = (order: WorkOrder) => `work-order-${order.id}-details`;

/**
 * Which rows are expanded, read by the toggle through context so the columns stay the same
 * objects when a row opens (new columns would re-create the cells and lose the button's focus).
 */
export const ExpandedRowsContext = createContext<{ expanded: ReadonlySet<number>; toggle: (id: number) => void }>({
  expanded: new Set(),
  toggle: () => {},
});

function DetailsToggle({ order }: { order: WorkOrder }) {
  const { expanded, toggle } = useContext(ExpandedRowsContext);
  const open = expanded.has(order.id);
  return (
    <button
      type="button"
      aria-expanded={open}
      aria-controls={open ? detailId(order) : undefined}
      onClick={() => toggle(order.id)}
      className="inline-flex size-8 items-center justify-center rounded-md border border-line-strong bg-surface hover:bg-dew-50"
    >
      <svg
        viewBox="0 0 16 16"
        className={cn("size-4 transition-transform motion-reduce:transition-none", open && "rotate-90")}
        aria-hidden="true"
      >
        <path
          d="m6 3.5 4.5 4.5L6 12.5"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.8"
          strokeLinecap="round"
          strokeLinejoin="round"
        />
      </svg>
      <span className="sr-only">Details of {orderReference(order)}</span>
    </button>
  );
}

interface ColumnOptions {
  today: string;
  onSchedule: (order: WorkOrder) => void;
}

export function workOrderColumns({ today, onSchedule }: ColumnOptions) {
  const sortable = (id: OrderSort) => ({
    id,
    header: ({ column: c }: { column: SortableColumn }) => <SortButton column={c}>{SORT_LABELS[id]}</SortButton>,
  });

  return column.columns([
    column.display({
      id: "details",
      header: () => <span className="sr-only">Details</span>,
      cell: ({ row }) => <DetailsToggle order={row.original} />,
    }),
    column.accessor((r) => r.caseReference ?? "", {
      id: "reference",
      header: "Reference",
      cell: ({ row }) => (
        <TextLink to={`/cases/${row.original.caseId}`} className="whitespace-nowrap">
          {orderReference(row.original)}
        </TextLink>
      ),
    }),
    column.accessor((r) => r.property.addressLine1, {
      id: "address",
      header: "Address",
      cell: ({ row }) => (
        <span className="block min-w-40">
          <span className="font-semibold">{row.original.property.addressLine1}</span>
          <span className="block text-ink-soft">
            {row.original.property.town}, <span className="whitespace-nowrap">{row.original.property.postcode}</span>
          </span>
        </span>
      ),
    }),
    column.accessor((r) => String(r.type), {
      ...sortable("type"),
      cell: (info) => labelFor(typeLabels, info.getValue()),
    }),
    column.accessor((r) => String(r.priority), {
      ...sortable("priority"),
      cell: (info) => (
        <span className={cn("whitespace-nowrap", info.getValue() !== "routine" && "font-bold")}>
          {labelFor(priorityLabels, info.getValue())}
        </span>
      ),
    }),
    column.accessor((r) => r.targetDate, {
      ...sortable("target"),
      cell: ({ row }) => <TargetDate order={row.original} today={today} />,
    }),
    column.accessor((r) => String(r.status), {
      ...sortable("status"),
      cell: ({ row }) => (
        <span className="flex flex-col gap-0.5">
          <span className="font-semibold whitespace-nowrap">{labelFor(statusLabels, row.original.status)}</span>
          {row.original.status === "scheduled" ? <TenantAnswerText order={row.original} withPrefix /> : null}
        </span>
      ),
    }),
    column.accessor((r) => r.assignee?.name ?? r.contractor?.name ?? "", {
      id: "who",
      header: "Operative or contractor",
      cell: ({ row }) =>
        row.original.assignee ? (
          <span className="whitespace-nowrap">{row.original.assignee.name}</span>
        ) : row.original.contractor ? (
          <span className="flex flex-col">
            <span className="whitespace-nowrap">{row.original.contractor.name}</span>
            <span className="text-ink-soft">Contractor</span>
          </span>
        ) : (
          <Missing>No one yet</Missing>
        ),
    }),
    column.accessor((r) => r.slot?.date ?? "", {
      ...sortable("slot"),
      cell: ({ row }) =>
        row.original.slot ? (
          <span className="flex flex-col whitespace-nowrap">
            <time dateTime={row.original.slot.date}>{formatShortDate(row.original.slot.date)}</time>
            <span className="text-ink-soft">{windowShortLabels[row.original.slot.window]}</span>
          </span>
        ) : (
          <Missing>Not booked</Missing>
        ),
    }),
    column.accessor((r) => r.createdAt, {
      ...sortable("created"),
      cell: (info) => (
        <time dateTime={info.getValue()} className="whitespace-nowrap">
          {formatDateTime(info.getValue())}
        </time>
      ),
    }),
    column.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row }) =>
        canSchedule(row.original) ? (
          <Button
            size="sm"
            variant={
              row.original.status === "unscheduled" || row.original.status === "change-requested" ? "primary" : "secondary"
            }
            onClick={() => onSchedule(row.original)}
            className="whitespace-nowrap"
          >
            {isReschedule(row.original) ? "Reschedule…" : "Schedule…"}
            <span className="sr-only"> {orderReference(row.original)}</span>
          </Button>
        ) : null,
    }),
  ]);
}
