import { Button } from "@/components/ui/button";
import type { DataTableInstance } from "@/components/ui/data-table";
import type { QueueItem } from "../api/types";
import type { QueueSort } from "../lib/queue-view";
import { FilterPopover } from "./filter-popover";
import { COLUMN_LABELS } from "./queue-columns";

/** Show or hide columns; the choice is kept in the URL (hide=…) by the table's visibility state. */
export function ColumnMenu({ table, onShowAll }: { table: DataTableInstance<QueueItem>; onShowAll: () => void }) {
  const hideable = table.getAllLeafColumns().filter((c) => c.getCanHide());
  const hiddenCount = hideable.filter((c) => !c.getIsVisible()).length;
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
      <Button size="sm" variant="secondary" onClick={onShowAll} disabled={hiddenCount === 0}>
        Show all columns
      </Button>
    </FilterPopover>
  );
}
