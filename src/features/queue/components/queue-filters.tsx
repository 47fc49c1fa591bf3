import { useId, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { controlClasses } from "@/components/ui/field";
import { SearchField } from "@/components/ui/search-field";
import { cn } from "@/lib/cn";
import { CASE_STATUSES, type CaseStatus } from "@/lib/domain/case-workflow";
import type { StaffMember } from "../api/types";
import type { QueueTableParams } from "../hooks/use-queue-table-params";
import { categoryLabels, riskLabels } from "../lib/labels";
import { DUE_WITHIN_CHOICES, HHSRS_BANDS, normaliseStatus, QUEUE_CATEGORIES, QUEUE_RISKS, statusesOf } from "../lib/queue-view";
import { CheckboxList, FilterPopover, PresetButton } from "./filter-popover";

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

const summarise = (chosen: readonly string[], labels: (v: string) => string, none = "Any") =>
  chosen.length === 0 ? none : chosen.length <= 2 ? chosen.map(labels).join(", ") : `${chosen.length} chosen`;

interface QueueFiltersProps {
  view: QueueTableParams;
  statusLabel: (status: string) => string;
  estates: readonly string[] | undefined;
  staff: readonly StaffMember[] | undefined;
  /** Shown at the end of the search row (the column menu), so the table starts higher up. */
  aside?: ReactNode;
}

/** Every filter of the queue, each with a visible label; every change goes to the URL. */
export function QueueFilters({ view, statusLabel, estates, staff, aside }: QueueFiltersProps) {
  const { params, filtered } = view;
  const status = normaliseStatus(params.status);
  const statusSummary = status === "open" ? "Open cases" : status === "all" ? "All statuses" : summarise(status, statusLabel);
  const hhsrsChosen = [
    ...params.category.map((c) => categoryLabels[c]),
    ...(params.band.length ? [`Band ${params.band.join(", ")}`] : []),
  ];
  const deadlineValue = String(view.deadline);
  const dueOptions: number[] = [...DUE_WITHIN_CHOICES];
  if (params.dueWithin !== null && !dueOptions.includes(params.dueWithin)) dueOptions.push(params.dueWithin);
  dueOptions.sort((a, b) => a - b);

  return (
    <div role="group" aria-label="Filter the queue" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <SearchField
          label="Search cases"
          hint="Reference, address or postcode"
          value={params.q}
          onSearch={view.setSearch}
          className="min-w-64 flex-1"
        />
        {aside}
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <FilterPopover label="Status" summary={statusSummary}>
          <div className="flex flex-wrap gap-2">
            <PresetButton pressed={status === "open"} onClick={() => view.setStatus("open")}>
              Open cases
            </PresetButton>
            <PresetButton pressed={status === "all"} onClick={() => view.setStatus("all")}>
              All
            </PresetButton>
          </div>
          <CheckboxList<CaseStatus>
            legend="Statuses"
            options={CASE_STATUSES.map((s) => ({ value: s, label: statusLabel(s) }))}
            selected={statusesOf(status)}
            onChange={(next) => view.setStatus(next)}
          />
        </FilterPopover>

        <FilterPopover label="Risk state" summary={summarise(params.risk, (r) => riskLabels[r as keyof typeof riskLabels])}>
          <CheckboxList
            legend="Surface state from the readings"
            options={QUEUE_RISKS.map((r) => ({ value: r, label: riskLabels[r] }))}
            selected={params.risk}
            onChange={view.setRisk}
          />
        </FilterPopover>

        <FilterPopover label="HHSRS" summary={hhsrsChosen.length ? hhsrsChosen.join("; ") : "Any"}>
          <CheckboxList
            legend="Category"
            options={QUEUE_CATEGORIES.map((c) => ({ value: c, label: categoryLabels[c] }))}
            selected={params.category}
            onChange={view.setCategory}
          />
          <CheckboxList
            legend="Band"
            columns={2}
            options={HHSRS_BANDS.map((b) => ({ value: b, label: `Band ${b}` }))}
            selected={params.band}
            onChange={view.setBand}
          />
        </FilterPopover>

        <SelectFilter label="Estate" value={params.estate} onChange={view.setEstate}>
          <option value="">All estates</option>
          {(estates ?? []).map((estate) => (
            <option key={estate} value={estate}>
              {estate}
            </option>
          ))}
          {params.estate && !(estates ?? []).includes(params.estate) ? (
            <option value={params.estate}>{params.estate}</option>
          ) : null}
        </SelectFilter>

        <SelectFilter
          label="Vulnerable household"
          value={params.vulnerable}
          onChange={(v) => view.setVulnerable(v as "" | "true" | "false")}
        >
          <option value="">Any</option>
          <option value="true">Yes</option>
          <option value="false">No</option>
        </SelectFilter>

        <SelectFilter
          label="Deadline"
          value={deadlineValue}
          onChange={(v) => view.setDeadline(v === "" || v === "overdue" ? v : Number(v))}
        >
          <option value="">Any deadline</option>
          <option value="overdue">Overdue</option>
          {dueOptions.map((days) => (
            <option key={days} value={String(days)}>
              Due within {days === 1 ? "1 day" : `${days} days`} (or overdue)
            </option>
          ))}
        </SelectFilter>

        <SelectFilter label="Assigned to" value={params.assignee} onChange={view.setAssignee}>
          <option value="">Anyone</option>
          <option value="me">Mine</option>
          <option value="unassigned">Unassigned</option>
          {staff && staff.length > 0 ? (
            <optgroup label="Staff">
              {staff.map((person) => (
                <option key={person.id} value={String(person.id)}>
                  {person.name}
                </option>
              ))}
            </optgroup>
          ) : null}
          {/^\d+$/.test(params.assignee) && !(staff ?? []).some((p) => String(p.id) === params.assignee) ? (
            <option value={params.assignee}>Staff member {params.assignee}</option>
          ) : null}
        </SelectFilter>

        <Button variant="secondary" size="sm" className="min-h-9" onClick={view.clearFilters} disabled={!filtered}>
          Clear filters
        </Button>
      </div>
    </div>
  );
}
