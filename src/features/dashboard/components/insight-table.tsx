import { ExportLinks } from "@/components/ui/export-links";
import type { ExportColumn } from "@/lib/contracts/exports";
import { INSIGHT_COLUMNS, type InsightTable as TableName } from "@/lib/contracts/insight";
import { insightQuery, type InsightFilters } from "../lib/insight-filters";

interface InsightTableProps<T> {
  table: TableName;
  rows: readonly T[];
  caption: string;
  filters: InsightFilters;
  /** Said in place of the table when there are no rows. */
  empty: string;
}

const cell = (v: unknown) =>
  v === null || v === undefined ? "—" : typeof v === "number" ? v.toLocaleString("en-GB") : String(v);

/**
 * One of the dashboard's tables, with the same columns and headings as its CSV/.xlsx export (the
 * contract's INSIGHT_COLUMNS), and the export links for the period and estate on screen.
 */
export function InsightTable<T>({ table, rows, caption, filters, empty }: InsightTableProps<T>) {
  const columns = INSIGHT_COLUMNS[table] as unknown as ExportColumn<T>[];
  return (
    <div className="flex flex-col gap-2">
      {rows.length === 0 ? (
        <p className="text-ink-soft">{empty}</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="mb-1 text-left font-semibold text-ink">{caption}</caption>
            <thead>
              <tr>
                {columns.map((c) => (
                  <th key={c.id} scope="col" className="border-b border-line-strong px-2 py-1 text-left font-semibold">
                    {c.header}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((row, i) => (
                <tr key={i} className="border-b border-line">
                  {columns.map((c, j) =>
                    j === 0 ? (
                      <th key={c.id} scope="row" className="px-2 py-1 text-left font-normal">
                        {cell(c.value(row))}
                      </th>
                    ) : (
                      <td key={c.id} className="px-2 py-1 tabular-nums">
                        {cell(c.value(row))}
                      </td>
                    ),
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <ExportLinks path="/insight/export" query={{ ...insightQuery(filters), table }} what={caption.toLowerCase()} />
    </div>
  );
}
