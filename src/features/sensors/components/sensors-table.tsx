import { useId } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { controlClasses } from "@/components/ui/field";
import { TextLink } from "@/components/ui/text-link";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import type { SensorResponse } from "@/lib/contracts";
import { useSensors } from "../api/get-sensors";
import { useSensorsTableParams } from "../hooks/use-sensors-table-params";
import { intervalLabel, lastSeen, sensorStateLabels } from "./sensor-state";

const column = dataTableColumnHelper<SensorResponse>();

const columns = column.columns([
  column.accessor("serial", {
    header: "Serial",
    cell: ({ row }) => (
      <span>
        <TextLink to={`/sensors/${row.original.id}`}>{row.original.serial}</TextLink>
        <span className="block text-ink-soft">{row.original.model}</span>
      </span>
    ),
  }),
  column.accessor("homeAddress", {
    header: "Home and room",
    cell: ({ row }) => (
      <span>
        <TextLink to={`/homes/${row.original.propertyId}`}>{row.original.homeAddress}</TextLink>
        <span className="block text-ink-soft">
          {row.original.roomName} · {row.original.placement}
        </span>
      </span>
    ),
  }),
  column.accessor("intervalS", { header: "Interval", cell: (info) => intervalLabel(info.getValue()) }),
  column.accessor("state", { header: "State", cell: (info) => sensorStateLabels[info.getValue()] }),
  column.accessor("lastReadingAt", { header: "Last reading", cell: ({ row }) => lastSeen(row.original) }),
]);

const noRows: SensorResponse[] = [];

/** The landlord's sensors, filtered by home and state and paged on the server. */
export function SensorsTable() {
  const stateId = useId();
  const { filters, setState, clearHome, setPage } = useSensorsTableParams();
  const sensors = useSensors(filters);
  const table = useServerTable({
    columns,
    data: sensors.data?.items ?? noRows,
    rowCount: sensors.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.id),
  });
  const filtered = Boolean(filters.state || filters.propertyId);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex flex-col gap-1">
          <label htmlFor={stateId} className="text-sm font-semibold">
            State
          </label>
          <select
            id={stateId}
            value={filters.state}
            onChange={(e) => setState(e.target.value)}
            className={cn(controlClasses, "min-h-9 w-auto py-1.5 pr-8 text-sm")}
          >
            <option value="">Every state</option>
            {(Object.keys(sensorStateLabels) as SensorResponse["state"][]).map((state) => (
              <option key={state} value={state}>
                {sensorStateLabels[state]}
              </option>
            ))}
          </select>
        </div>
        {filters.propertyId ? (
          <Button size="sm" variant="secondary" onClick={clearHome}>
            Show every home
          </Button>
        ) : null}
      </div>
      <DataTable
        table={table}
        caption="Sensors"
        hideCaption
        noun={{ one: "sensor", many: "sensors" }}
        loading={sensors.isPending}
        fetching={sensors.isFetching && !sensors.isPending}
        error={
          sensors.isError ? (
            <Alert tone="danger" title="We could not load the sensors">
              {errorMessage(sensors.error)}
            </Alert>
          ) : undefined
        }
        empty={
          <EmptyState title={filtered ? "No sensors match" : "No sensors yet"}>
            {filtered ? "Try every state, or every home." : "Sensors appear here once a lead registers them."}
          </EmptyState>
        }
      />
    </div>
  );
}
