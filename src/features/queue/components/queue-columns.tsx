import { useEffect, useRef, type ReactNode } from "react";
import { dataTableColumnHelper, SortButton, type SortableColumn } from "@/components/ui/data-table";
import { TextLink } from "@/components/ui/text-link";
import { cn } from "@/lib/cn";
import { QUEUE_COLUMN_LABELS } from "@/lib/contracts/exports";
import type { QueueItem } from "../api/types";
import { formatDay } from "@/lib/dates";
import { areaLabels, channelLabels, labelFor, riskLabels } from "../lib/labels";
import type { QueueSort } from "../lib/queue-view";
import { TimeLeftText } from "./time-left";
import { NO_DEADLINE_RUNNING, nextDeadlineWords } from "@/lib/deadline-words";

/** The heading of each data column (shared with the export); the column ids are the API's sort keys. */
export const COLUMN_LABELS: Record<QueueSort, string> = QUEUE_COLUMN_LABELS;

export const caseReference = (item: Pick<QueueItem, "id" | "reference">) => item.reference ?? `Case ${item.id}`;

function Checkbox({
  checked,
  indeterminate = false,
  label,
  onChange,
}: {
  checked: boolean;
  indeterminate?: boolean;
  label: string;
  onChange: (checked: boolean) => void;
}) {
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (ref.current) ref.current.indeterminate = indeterminate;
  }, [indeterminate]);
  return (
    <input
      ref={ref}
      type="checkbox"
      aria-label={label}
      checked={checked}
      onChange={(e) => onChange(e.target.checked)}
      className="block size-4 accent-dew-700"
    />
  );
}

const Missing = ({ children }: { children: ReactNode }) => <span className="text-ink-soft">{children}</span>;

const column = dataTableColumnHelper<QueueItem>();

interface ColumnOptions {
  renderStatus: (status: string) => ReactNode;
  now: number;
}

export function queueColumns({ renderStatus, now }: ColumnOptions) {
  const sortable = (id: QueueSort) => ({
    id,
    header: ({ column: c }: { column: SortableColumn }) => <SortButton column={c}>{COLUMN_LABELS[id]}</SortButton>,
    // Most urgent first for priority; A to Z, smallest or earliest first for the rest (as the API).
    sortDescFirst: id === "priority",
  });

  return column.columns([
    // The tick box and the reference stay in view when the table scrolls sideways (DataTable's stickyColumns).
    column.display({
      id: "select",
      enableSorting: false,
      enableHiding: false,
      header: ({ table }) => (
        <Checkbox
          label="Select every case on this page"
          checked={table.getIsAllPageRowsSelected()}
          indeterminate={table.getIsSomePageRowsSelected() && !table.getIsAllPageRowsSelected()}
          onChange={(checked) => table.toggleAllPageRowsSelected(checked)}
        />
      ),
      cell: ({ row }) => (
        <Checkbox
          label={`Select ${caseReference(row.original)}`}
          checked={row.getIsSelected()}
          onChange={(checked) => row.toggleSelected(checked)}
        />
      ),
    }),
    column.accessor((r) => r.reference ?? "", {
      ...sortable("reference"),
      enableHiding: false,
      cell: ({ row }) => (
        <TextLink to={`/cases/${row.original.id}`} className="whitespace-nowrap">
          {caseReference(row.original)}
        </TextLink>
      ),
    }),
    column.accessor((r) => r.priority, {
      ...sortable("priority"),
      cell: (info) => (
        <span className="font-semibold whitespace-nowrap tabular-nums">
          {info.getValue()}
          <span className="font-normal text-ink-soft"> / 100</span>
        </span>
      ),
    }),
    column.accessor((r) => r.property.addressLine1, {
      ...sortable("address"),
      // One line, cut short with an ellipsis when the column is narrow; the whole address is its title.
      cell: ({ row }) => {
        const p = row.original.property;
        return (
          <span className="block max-w-80 min-w-32 truncate" title={`${p.addressLine1}, ${p.town}, ${p.postcode}`}>
            <TextLink to={`/homes/${p.id}`} className="font-semibold">
              {p.addressLine1}
            </TextLink>
            <span className="text-ink-soft">, {p.postcode}</span>
          </span>
        );
      },
    }),
    column.accessor((r) => r.riskState ?? "unknown", {
      ...sortable("risk"),
      cell: ({ row }) =>
        row.original.riskState ? (
          <span className="font-semibold whitespace-nowrap">{riskLabels[row.original.riskState]}</span>
        ) : (
          <Missing>{riskLabels.unknown}</Missing>
        ),
    }),
    column.accessor((r) => r.nextDeadline?.dueAt ?? "", {
      ...sortable("due"),
      cell: ({ row }) => {
        const next = row.original.nextDeadline;
        if (!next) return <Missing>{NO_DEADLINE_RUNNING}</Missing>;
        const words = nextDeadlineWords(next, row.original.overdue, now);
        return (
          <span className="flex items-center gap-x-2 whitespace-nowrap">
            <TimeLeftText left={words.left} />
            <span className="text-ink-soft">
              {words.stage}, <time dateTime={next.dueAt}>{words.due}</time>
            </span>
          </span>
        );
      },
    }),
    column.accessor((r) => String(r.status), {
      ...sortable("status"),
      cell: (info) => renderStatus(info.getValue()),
    }),
    column.accessor((r) => r.property.estate, {
      ...sortable("estate"),
      cell: ({ row }) => (
        <span className="whitespace-nowrap">
          {row.original.property.estate}
          {row.original.property.block ? <span className="text-ink-soft">, {row.original.property.block}</span> : null}
        </span>
      ),
    }),
    column.accessor((r) => r.rooms.map((room) => room.name).join(", "), {
      ...sortable("rooms"),
      cell: ({ row }) =>
        row.original.rooms.length ? (
          <span className="whitespace-nowrap">{row.original.rooms.map((room) => room.name).join(", ")}</span>
        ) : (
          <Missing>Not given</Missing>
        ),
    }),
    column.accessor((r) => r.awareAt, {
      ...sortable("awareAt"),
      cell: ({ row }) => (
        <time dateTime={row.original.awareAt} className="whitespace-nowrap">
          {formatDay(row.original.awareAt)}
        </time>
      ),
    }),
    column.accessor((r) => r.channel, {
      ...sortable("channel"),
      cell: (info) => <span className="whitespace-nowrap">{labelFor(channelLabels, info.getValue())}</span>,
    }),
    column.accessor((r) => r.mouldIndex ?? -1, {
      ...sortable("mouldIndex"),
      cell: ({ row }) =>
        row.original.mouldIndex === null ? (
          <Missing>
            <span aria-hidden="true">—</span>
            <span className="sr-only">Not worked out</span>
          </Missing>
        ) : (
          <span className="whitespace-nowrap">
            {row.original.mouldIndex.toFixed(1)}
            <span className="text-ink-soft"> of 6</span>
          </span>
        ),
    }),
    column.accessor((r) => r.area ?? "", {
      ...sortable("area"),
      cell: (info) =>
        info.getValue() ? (
          <span className="whitespace-nowrap">{labelFor(areaLabels, info.getValue())}</span>
        ) : (
          <Missing>Not given</Missing>
        ),
    }),
    column.accessor((r) => (r.vulnerableHousehold ? 1 : 0), {
      ...sortable("vulnerable"),
      cell: ({ row }) =>
        row.original.vulnerableHousehold ? (
          <span className="inline-flex items-center gap-1 font-semibold whitespace-nowrap">
            <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true">
              <circle cx="8" cy="8" r="7" fill="currentColor" />
              <path d="M8 4v5M8 11.2v.1" stroke="#fff" strokeWidth="1.8" strokeLinecap="round" />
            </svg>
            Yes
          </span>
        ) : (
          "No"
        ),
    }),
    column.accessor((r) => r.hhsrs?.band ?? "", {
      ...sortable("band"),
      cell: ({ row }) =>
        row.original.hhsrs ? (
          <span className="whitespace-nowrap">
            Band {row.original.hhsrs.band},{" "}
            <span className={cn(row.original.hhsrs.category === 1 ? "font-bold" : "text-ink-soft")}>
              Category {row.original.hhsrs.category}
            </span>
          </span>
        ) : (
          <Missing>Not assessed</Missing>
        ),
    }),
    column.accessor((r) => r.assignee?.name ?? "", {
      ...sortable("assignee"),
      cell: ({ row }) =>
        row.original.assignee ? (
          <span className="whitespace-nowrap">{row.original.assignee.name}</span>
        ) : (
          <Missing>Unassigned</Missing>
        ),
    }),
  ]);
}
