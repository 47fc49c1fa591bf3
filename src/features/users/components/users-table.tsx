import { useId, useMemo, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { ExportLinks } from "@/components/ui/export-links";
import { controlClasses } from "@/components/ui/field";
import { SearchField } from "@/components/ui/search-field";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/dates";
import { ROLES, roleLabels } from "@/lib/roles";
import { useUsers, usersQuery } from "../api/get-users";
import type { ManagedUser } from "../api/types";
import { useUsersTableParams } from "../hooks/use-users-table-params";
import { StatusBadge } from "./status-badge";
import { UserDetail } from "./user-detail";

const noRows: ManagedUser[] = [];
const column = dataTableColumnHelper<ManagedUser>();

export function UsersTable({ currentUserId }: { currentUserId: number }) {
  const roleId = useId();
  const { filters, setSearch, setRole, setPage } = useUsersTableParams();
  const users = useUsers(filters);
  const [selected, setSelected] = useState<ManagedUser | null>(null);

  const columns = useMemo(
    () =>
      column.columns([
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
            return (
              <span className="flex items-center gap-2 whitespace-nowrap">
                <Button size="sm" variant="secondary" onClick={() => setSelected(user)} aria-label={`Manage ${user.name}`}>
                  Manage
                </Button>
                {user.id === currentUserId ? <span className="text-xs text-ink-soft">This is you</span> : null}
              </span>
            );
          },
        }),
      ]),
    [currentUserId],
  );

  const table = useServerTable({
    columns,
    data: users.data?.items ?? noRows,
    rowCount: users.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
  });

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
        <ExportLinks path="/users/export" query={usersQuery(filters)} what="people in this list" />
      </div>

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

      {selected ? (
        <UserDetail
          key={selected.id}
          user={selected}
          currentUserId={currentUserId}
          onClose={() => setSelected(null)}
          onChanged={setSelected}
        />
      ) : null}
    </div>
  );
}
