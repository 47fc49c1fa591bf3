import { Button } from "@/components/ui/button";
import type { DataTableInstance } from "@/components/ui/data-table";
import type { QueueItem } from "../api/types";
import { DEFAULT_SHOWN_COLUMNS, type QueueSort } from "../lib/queue-view";
import { FilterPopover } from "./filter-popover";
import { COLUMN_LABELS } from "./queue-columns";

interface ColumnMenuProps {
  table: DataTableInstance<QueueItem>;
  onShowAll: () => void;
  /** Back to the usual columns. */
  onReset: () => void;
}

/**
 * Show or hide columns. The usual ones fit a laptop screen; the choice is kept in the link (cols=…)
 * and in this browser for the next visit.
 */
export function ColumnMenu({ table, onShowAll, onReset }: ColumnMenuProps) {
  const hideable = table.getAllLeafColumns().filter((c) => c.getCanHide());
  const hiddenCount = hideable.filter((c) => !c.getIsVisible()).length;
  const usual = hideable.every((c) => c.getIsVisible() === (DEFAULT_SHOWN_COLUMNS as readonly string[]).includes(c.id));
  return (
    <FilterPopover label="Columns" summary={hiddenCount === 0 ? "All shown" : `${hiddenCount} hidden`} align="end">
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 font-semibold">Show these columns</legend>
        {hideable.map((c) => (
          <label key={c.id} className="flex min-h-8 cursor-pointer items-center gap-2">
            <input
              type="checkbox"
              className="size-4 accent-dew-700"
              checked={c.getIsVisible()}
              onChange={(e) => c.toggleVisibility(e.target.checked)}
            />
            <span>{COLUMN_LABELS[c.id as QueueSort] ?? c.id}</span>
          </label>
        ))}
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" onClick={onReset} disabled={usual}>
          Usual columns
        </Button>
        <Button size="sm" variant="secondary" onClick={onShowAll} disabled={hiddenCount === 0}>
          Show all columns
        </Button>
      </div>
      <p className="text-xs text-ink-soft">More columns may make the table scroll sideways.</p>
    </FilterPopover>
  );
}
