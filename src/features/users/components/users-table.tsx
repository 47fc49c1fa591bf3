import { useId, useMemo, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { controlClasses } from "@/components/ui/field";
import { SearchField } from "@/components/ui/search-field";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/dates";
import { ROLES, roleLabels } from "@/lib/roles";
import { useUsers } from "../api/get-users";
import { userStatusLabels, type ManagedUser, type UserStatus } from "../api/types";
import { useUpdateUserStatus } from "../api/update-user-status";
import { useUsersTableParams } from "../hooks/use-users-table-params";

const statusClasses: Record<UserStatus, string> = {
  active: "bg-moss-50 text-moss-700 border-moss-600",
  invited: "bg-dew-50 text-dew-800 border-dew-500",
  disabled: "bg-paper text-ink-soft border-line-strong border-dashed",
};

function StatusBadge({ status }: { status: UserStatus }) {
  return (
    <span
      className={cn(
        "inline-flex items-center rounded-pill border px-2 py-0.5 text-xs font-semibold whitespace-nowrap",
        statusClasses[status],
      )}
    >
      {userStatusLabels[status]}
    </span>
  );
}

interface PendingChange {
  user: ManagedUser;
  status: "active" | "disabled";
}

const noRows: ManagedUser[] = [];
const column = dataTableColumnHelper<ManagedUser>();

export function UsersTable({ currentUserId }: { currentUserId: number }) {
  const roleId = useId();
  const { filters, setSearch, setRole, setPage } = useUsersTableParams();
  const users = useUsers(filters);
  const update = useUpdateUserStatus();
  const [pending, setPending] = useState<PendingChange | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const columns = useMemo(() => {
    const ask = (user: ManagedUser, status: "active" | "disabled") => {
      setDone(null);
      setPending({ user, status });
    };
    return column.columns([
      column.accessor("name", { header: "Name", cell: (info) => <span className="font-semibold">{info.getValue()}</span> }),
      column.accessor("email", {
        header: "E-mail",
        cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span>,
      }),
      column.accessor("role", { header: "Role", cell: (info) => roleLabels[info.getValue()] ?? info.getValue() }),
      column.accessor("status", { header: "Status", cell: (info) => <StatusBadge status={info.getValue()} /> }),
      column.accessor("lastSignInAt", {
        header: "Last sign-in",
        cell: (info) => {
          const v = info.getValue();
          return v ? (
            <span className="whitespace-nowrap">{formatDateTime(v)}</span>
          ) : (
            <span className="text-ink-soft">Never</span>
          );
        },
      }),
      column.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => {
          const user = row.original;
          if (user.id === currentUserId) return <span className="text-xs text-ink-soft">This is you</span>;
          if (user.status === "invited") return <span className="text-xs text-ink-soft">Waiting for them to accept</span>;
          return user.status === "active" ? (
            <Button size="sm" variant="secondary" onClick={() => ask(user, "disabled")} aria-label={`Disable ${user.name}`}>
              Disable
            </Button>
          ) : (
            <Button size="sm" variant="secondary" onClick={() => ask(user, "active")} aria-label={`Enable ${user.name}`}>
              Enable
            </Button>
          );
        },
      }),
    ]);
  }, [currentUserId]);

  const table = useServerTable({
    columns,
    data: users.data?.items ?? noRows,
    rowCount: users.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
  });

  const confirm = () => {
    if (!pending) return;
    update.mutate(
      { id: pending.user.id, status: pending.status },
      {
        onSuccess: (user) => {
          setPending(null);
          setDone(`${user.name}'s account is now ${user.status === "active" ? "enabled" : "disabled"}.`);
        },
      },
    );
  };

  const filtered = Boolean(filters.q || filters.role);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <SearchField
          label="Search people"
          hint="Name or e-mail address"
          value={filters.q}
          onSearch={setSearch}
          className="min-w-64 flex-1"
        />
        <div className="flex flex-col gap-1">
          <label htmlFor={roleId} className="text-sm font-semibold">
            Filter by role
          </label>
          <select
            id={roleId}
            value={filters.role}
            onChange={(e) => setRole(e.target.value)}
            className={cn(controlClasses, "min-h-9 w-auto py-1.5 pr-8 text-sm")}
          >
            <option value="">All roles</option>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {roleLabels[r]}
              </option>
            ))}
          </select>
        </div>
      </div>

      {done ? <Alert tone="success">{done}</Alert> : null}

      <DataTable
        table={table}
        caption="People in your organisation"
        hideCaption
        noun={{ one: "person", many: "people" }}
        loading={users.isPending}
        fetching={users.isFetching && !users.isPending}
        error={
          users.isError ? (
            <Alert tone="danger" title="We could not load the list of people">
              {errorMessage(users.error)}
            </Alert>
          ) : undefined
        }
        empty={
          <EmptyState title={filtered ? "Nobody matches" : "Nobody here yet"}>
            {filtered ? "Try a different search or choose All roles." : "Invite someone with the form on this page."}
          </EmptyState>
        }
      />

      <ConfirmDialog
        open={pending !== null}
        title={
          pending?.status === "disabled"
            ? `Disable ${pending.user.name}'s account?`
            : `Enable ${pending?.user.name ?? ""}'s account?`
        }
        confirmLabel={pending?.status === "disabled" ? "Disable account" : "Enable account"}
        tone={pending?.status === "disabled" ? "danger" : "primary"}
        busy={update.isPending}
        error={update.isError ? errorMessage(update.error) : null}
        onConfirm={confirm}
        onCancel={() => {
          update.reset();
          setPending(null);
        }}
      >
        {pending?.status === "disabled" ? (
          <p>
            {pending.user.name} ({pending.user.email}) will be signed out and will not be able to sign in until you enable the
            account again. Nothing they have recorded is deleted.
          </p>
        ) : pending ? (
          <p>
            {pending.user.name} ({pending.user.email}) will be able to sign in again with their existing password.
          </p>
        ) : null}
      </ConfirmDialog>
    </div>
  );
}
