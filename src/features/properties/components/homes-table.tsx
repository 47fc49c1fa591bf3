import { useEffect, useId, useRef } from "react";
import { useNavigate } from "react-router-dom";
import { TextLink } from "@/components/ui/text-link";
import { Alert } from "@/components/ui/alert";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { ExportLinks } from "@/components/ui/export-links";
import { controlClasses } from "@/components/ui/field";
import { SearchField } from "@/components/ui/search-field";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { builtFormLabels, heatingTypeLabels, labelOf, wallTypeLabels, type PropertySummary } from "@/lib/homes";
import { useEstates } from "../api/get-estates";
import { propertiesQuery, useProperties } from "../api/get-properties";
import { useHomesTableParams } from "../hooks/use-homes-table-params";

const column = dataTableColumnHelper<PropertySummary>();

const columns = column.columns([
  column.accessor("addressLine1", {
    header: "Address",
    cell: ({ row }) => (
      <span>
        <TextLink to={`/homes/${row.original.id}`} data-row-link="">
          {row.original.addressLine1}
        </TextLink>
        {row.original.addressLine2 ? <span>, {row.original.addressLine2}</span> : null}
        <span className="block text-ink-soft">{row.original.town}</span>
      </span>
    ),
  }),
  column.accessor("postcode", {
    header: "Postcode",
    cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span>,
  }),
  column.accessor("estate", {
    header: "Estate",
    cell: ({ row }) => (
      <span>
        {row.original.estate}
        {row.original.block ? <span className="block text-ink-soft">{row.original.block}</span> : null}
      </span>
    ),
  }),
  column.accessor("builtForm", { header: "Type", cell: (info) => labelOf(builtFormLabels, info.getValue()) }),
  column.accessor("wallType", { header: "Walls", cell: (info) => labelOf(wallTypeLabels, info.getValue()) }),
  column.accessor("heatingType", { header: "Heating", cell: (info) => labelOf(heatingTypeLabels, info.getValue()) }),
  column.accessor("uprn", {
    header: "UPRN",
    cell: (info) => <span className="font-mono text-xs">{info.getValue() ?? "—"}</span>,
  }),
]);

const noRows: PropertySummary[] = [];

/** The organisation's homes, searched, filtered and paged on the server. */
export function HomesTable({ caption = "Homes" }: { caption?: string }) {
  const estateId = useId();
  const { filters, setSearch, setEstate, setPage } = useHomesTableParams();
  const homes = useProperties(filters);
  const estates = useEstates();

  const table = useServerTable({
    columns,
    data: homes.data?.items ?? noRows,
    rowCount: homes.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
  });

  const filtered = Boolean(filters.q || filters.estate);
  const navigate = useNavigate();

  // A click anywhere on a row opens the home, like its address link (the keyboard's way in).
  const rowsRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const box = rowsRef.current;
    if (!box) return;
    const openRow = (event: MouseEvent) => {
      const target = event.target as HTMLElement;
      if (target.closest("a, button, input, select, label")) return;
      const href = target.closest("tbody tr")?.querySelector("a[data-row-link]")?.getAttribute("href");
      if (href) void navigate(href);
    };
    box.addEventListener("click", openRow);
    return () => box.removeEventListener("click", openRow);
  }, [navigate]);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <SearchField
          label="Search homes"
          hint="Street, town, postcode, UPRN or estate"
          value={filters.q}
          onSearch={setSearch}
          className="min-w-64 flex-1"
        />
        <div className="flex flex-col gap-1">
          <label htmlFor={estateId} className="text-sm font-semibold">
            Estate
          </label>
          <select
            id={estateId}
            value={filters.estate}
            onChange={(e) => setEstate(e.target.value)}
            className={cn(controlClasses, "min-h-9 w-auto py-1.5 pr-8 text-sm")}
          >
            <option value="">All estates</option>
            {(estates.data ?? []).map((estate) => (
              <option key={estate} value={estate}>
                {estate}
              </option>
            ))}
            {filters.estate && estates.data && !estates.data.includes(filters.estate) ? (
              <option value={filters.estate}>{filters.estate}</option>
            ) : null}
          </select>
        </div>
        <ExportLinks path="/properties/export" query={propertiesQuery(filters)} what="homes in this list" />
      </div>
      <div ref={rowsRef} className="[&_tbody_tr:has(a[data-row-link])]:cursor-pointer">
        <DataTable
          table={table}
          caption={caption}
          hideCaption
          noun={{ one: "home", many: "homes" }}
          loading={homes.isPending}
          fetching={homes.isFetching && !homes.isPending}
          error={
            homes.isError ? (
              <Alert tone="danger" title="We could not load the homes">
                {errorMessage(homes.error)}
              </Alert>
            ) : undefined
          }
          empty={
            <EmptyState title={filtered ? "No homes match" : "No homes yet"}>
              {filtered
                ? "Try a shorter search, or choose All estates."
                : "Homes will appear here once they are added for your organisation."}
            </EmptyState>
          }
        />
      </div>
    </div>
  );
}
