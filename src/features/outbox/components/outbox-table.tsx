import { useId, useMemo } from "react";
import { Link } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { controlClasses } from "@/components/ui/field";
import { textLinkClasses } from "@/components/ui/text-link";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { OUTBOX_STATUSES, type OutboxItem, type OutboxStatusName } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useOutbox } from "../api/get-outbox";
import { useOutboxTableParams } from "../hooks/use-outbox-table-params";
import { ResendEmailButton } from "./resend-email-button";

export const outboxStatusLabels: Record<OutboxStatusName, string> = {
  pending: "Waiting to be sent",
  sending: "Being sent",
  sent: "Sent",
  failed: "Not sent",
};

const statusClasses: Record<OutboxStatusName, string> = {
  pending: "bg-dew-50 text-dew-800 border-dew-500",
  sending: "bg-dew-50 text-dew-800 border-dew-500",
  sent: "bg-moss-50 text-moss-700 border-moss-600",
  failed: "bg-paper text-rust-700 border-rust-600",
};

const noRows: OutboxItem[] = [];
const column = dataTableColumnHelper<OutboxItem>();

/** What is happening to the e-mail now, in words: the state, the last error and when it is tried again. */
function StateCell({ item }: { item: OutboxItem }) {
  return (
    <span className="flex flex-col gap-0.5">
      <span
        className={cn(
          "inline-flex w-fit items-center rounded-pill border px-2 py-0.5 text-xs font-semibold whitespace-nowrap",
          statusClasses[item.status],
        )}
      >
        {outboxStatusLabels[item.status]}
      </span>
      {item.status === "sent" && item.sentAt ? (
        <span className="text-sm whitespace-nowrap text-ink-soft">{formatDateTime(item.sentAt)}</span>
      ) : null}
      {item.error && item.status !== "sent" ? <span className="text-sm text-rust-700">{item.error}</span> : null}
      {item.status === "pending" && item.nextAttemptAt && item.attempts > 0 ? (
        <span className="text-sm text-ink-soft">
          Tried {item.attempts} {item.attempts === 1 ? "time" : "times"}; next try {formatDateTime(item.nextAttemptAt)}
        </span>
      ) : null}
    </span>
  );
}

/** The landlord's e-mails, newest first, with a state filter; a sent or failed one can be sent again. */
export function OutboxTable() {
  const statusId = useId();
  const { filters, setStatus, setPage } = useOutboxTableParams();
  const outbox = useOutbox(filters);

  const columns = useMemo(
    () =>
      column.columns([
        column.accessor("createdAt", {
          header: "Queued",
          cell: (info) => <span className="whitespace-nowrap">{formatDateTime(info.getValue())}</span>,
        }),
        column.accessor("to", { header: "To", cell: (info) => <span className="break-all">{info.getValue()}</span> }),
        column.accessor("subject", {
          header: "Subject",
          cell: ({ row }) => (
            <span className="flex flex-col">
              <span>{row.original.subject}</span>
              {row.original.case ? (
                <Link to={`/cases/${row.original.case.id}`} className={cn(textLinkClasses, "text-sm")}>
                  Open the case
                </Link>
              ) : null}
            </span>
          ),
        }),
        column.accessor("status", { header: "State", cell: ({ row }) => <StateCell item={row.original} /> }),
        column.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) => <ResendEmailButton outboxId={row.original.id} status={row.original.status} to={row.original.to} />,
        }),
      ]),
    [],
  );

  const table = useServerTable({
    columns,
    data: outbox.data?.items ?? noRows,
    rowCount: outbox.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
  });

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={statusId} className="text-sm font-semibold">
          Filter by state
        </label>
        <select
          id={statusId}
          value={filters.status}
          onChange={(e) => setStatus(e.target.value)}
          className={cn(controlClasses, "min-h-9 w-auto self-start py-1.5 pr-8 text-sm")}
        >
          <option value="">All states</option>
          {OUTBOX_STATUSES.map((s) => (
            <option key={s} value={s}>
              {outboxStatusLabels[s]}
            </option>
          ))}
        </select>
      </div>
      <DataTable
        table={table}
        caption="E-mails sent by Dewline for your organisation"
        hideCaption
        noun={{ one: "e-mail", many: "e-mails" }}
        loading={outbox.isPending}
        fetching={outbox.isFetching && !outbox.isPending}
        error={
          outbox.isError ? (
            <Alert tone="danger" title="We could not load the e-mails">
              {errorMessage(outbox.error)}
            </Alert>
          ) : undefined
        }
        empty={
          <EmptyState title={filters.status ? "No e-mails in this state" : "No e-mails yet"}>
            {filters.status ? "Choose All states to see every e-mail." : "E-mails appear here as Dewline sends them."}
          </EmptyState>
        }
      />
    </div>
  );
}
