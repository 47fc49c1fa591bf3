import { useId, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { controlClasses } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import type { StaffMember } from "@/lib/staff";
import { WORK_ORDER_STATUSES, WORK_ORDER_TYPES, type WorkOrderStatus, type WorkOrderType } from "../api/types";
import type { OrdersTableParams } from "../hooks/use-works-params";
import { statusLabels, typeLabels } from "../lib/labels";

const selectClasses = cn(controlClasses, "min-h-9 w-auto py-1.5 pr-8 text-sm");

function SelectFilter({
  label,
  value,
  onChange,
  children,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  children: ReactNode;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className={selectClasses}>
        {children}
      </select>
    </div>
  );
}

interface WorkOrdersFiltersProps {
  view: OrdersTableParams;
  staff: readonly StaffMember[] | undefined;
}

/** The orders table's filters, each with a visible label; every change goes to the URL. */
export function WorkOrdersFilters({ view, staff }: WorkOrdersFiltersProps) {
  const { params } = view;
  const operatives = (staff ?? []).filter((p) => p.role === "maintenance");
  const toggle = (status: WorkOrderStatus, on: boolean) => {
    const next = on ? [...params.status, status] : params.status.filter((s) => s !== status);
    if (next.length) view.setStatus(next);
  };

  return (
    <div role="group" aria-label="Filter the orders" className="flex flex-wrap items-end gap-x-5 gap-y-3">
      <fieldset className="flex min-w-0 flex-col gap-1">
        <legend className="text-sm font-semibold">Status</legend>
        <div className="flex flex-wrap gap-x-3 gap-y-1">
          {WORK_ORDER_STATUSES.map((status) => {
            const checked = params.status.includes(status);
            const onlyOne = checked && params.status.length === 1;
            return (
              <label key={status} className="inline-flex min-h-8 items-center gap-1.5 text-sm">
                <input
                  type="checkbox"
                  checked={checked}
                  // At least one status stays ticked: an order always has one.
                  disabled={onlyOne}
                  onChange={(e) => toggle(status, e.target.checked)}
                  className="size-4 accent-dew-700"
                />
                {statusLabels[status]}
              </label>
            );
          })}
        </div>
      </fieldset>

      <SelectFilter label="Type of work" value={params.type} onChange={(v) => view.setType(v as WorkOrderType | "")}>
        <option value="">Any type</option>
        {WORK_ORDER_TYPES.map((type) => (
          <option key={type} value={type}>
            {typeLabels[type]}
          </option>
        ))}
      </SelectFilter>

      <SelectFilter label="Booked with" value={params.assignee} onChange={view.setAssignee}>
        <option value="">Anyone</option>
        <option value="me">Mine</option>
        <option value="unassigned">No operative yet</option>
        {operatives.length ? (
          <optgroup label="Operatives">
            {operatives.map((person) => (
              <option key={person.id} value={String(person.id)}>
                {person.name}
              </option>
            ))}
          </optgroup>
        ) : null}
        {/^\d+$/.test(params.assignee) && !operatives.some((p) => String(p.id) === params.assignee) ? (
          <option value={params.assignee}>Staff member {params.assignee}</option>
        ) : null}
      </SelectFilter>

      <Button variant="secondary" size="sm" className="min-h-9" onClick={view.clearFilters} disabled={!view.filtered}>
        Clear filters
      </Button>
    </div>
  );
}
