import { Input, Select } from "@/components/ui/field";
import type { InsightFilters } from "../lib/insight-filters";

/** Period (London dates, inclusive) and estate; each change goes straight into the URL. */
export function DashboardFilters({
  filters,
  shown,
  estates,
  onChange,
}: {
  filters: InsightFilters;
  /** The period the server used (its default when the URL has none). */
  shown: { from: string; to: string } | null;
  estates: string[];
  onChange: (next: Partial<InsightFilters>) => void;
}) {
  return (
    <form
      role="search"
      aria-label="Dashboard period and estate"
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => e.preventDefault()}
    >
      <Input
        type="date"
        label="From"
        hint="Reported on or after"
        value={filters.from || shown?.from || ""}
        onChange={(e) => onChange({ from: e.target.value })}
      />
      <Input
        type="date"
        label="To"
        hint="Reported on or before"
        value={filters.to || shown?.to || ""}
        onChange={(e) => onChange({ to: e.target.value })}
      />
      <Select label="Estate" value={filters.estate} onChange={(e) => onChange({ estate: e.target.value })}>
        <option value="">All estates</option>
        {estates.map((estate) => (
          <option key={estate} value={estate}>
            {estate}
          </option>
        ))}
        {filters.estate && !estates.includes(filters.estate) ? <option value={filters.estate}>{filters.estate}</option> : null}
      </Select>
    </form>
  );
}
