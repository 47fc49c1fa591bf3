import { useId, useMemo } from "react";
import { Alert } from "@/components/ui/alert";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { controlClasses } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { SENSOR_PROBLEMS, type SensorAttentionItem } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useSensorsNeedingAttention } from "../api/get-sensors-needing-attention";
import { useSensorHealthParams } from "../hooks/use-sensor-health-params";
import { SensorHealthBadge } from "./sensor-health-badge";
import { sensorProblemHelp, sensorProblemLabels } from "./sensor-problem-labels";

const noRows: SensorAttentionItem[] = [];
const column = dataTableColumnHelper<SensorAttentionItem>();

/** Each problem with when it began and why. */
function FindingsCell({ item }: { item: SensorAttentionItem }) {
  return (
    <ul className="flex flex-col gap-1.5">
      {item.findings.map((f) => (
        <li key={f.problem} className="flex flex-col">
          <span className="text-sm">
            <span className="font-semibold">{sensorProblemLabels[f.problem]}</span> since {formatDateTime(f.since)}
          </span>
          <span className="text-sm text-ink-soft">{f.reason}</span>
          <span className="text-sm text-ink-soft">{sensorProblemHelp[f.problem]}</span>
        </li>
      ))}
    </ul>
  );
}

/** The landlord's sensors needing attention, by home, with a problem filter; state in the URL. */
export function SensorsNeedingAttention() {
  const problemId = useId();
  const { filters, setProblem, setPage } = useSensorHealthParams();
  const list = useSensorsNeedingAttention(filters);

  const columns = useMemo(
    () =>
      column.columns([
        column.accessor((r) => `${r.home.addressLine1}, ${r.home.town}`, {
          id: "home",
          header: "Home",
          cell: ({ row }) => (
            <span className="flex flex-col">
              <span>{row.original.home.addressLine1}</span>
              <span className="text-sm text-ink-soft">
                {row.original.home.town} {row.original.home.postcode}
              </span>
            </span>
          ),
        }),
        column.accessor((r) => r.room.name, { id: "room", header: "Room" }),
        column.accessor((r) => r.sensor.serial, {
          id: "serial",
          header: "Sensor",
          cell: ({ row }) => (
            <span className="flex flex-col">
              <span className="font-mono text-sm">{row.original.sensor.serial}</span>
              <span className="text-sm text-ink-soft">{row.original.sensor.placement}</span>
            </span>
          ),
        }),
        column.display({
          id: "state",
          header: "State",
          cell: ({ row }) => <SensorHealthBadge problems={row.original.findings.map((f) => f.problem)} />,
        }),
        column.display({ id: "why", header: "Since and why", cell: ({ row }) => <FindingsCell item={row.original} /> }),
        column.accessor("lastReadingAt", {
          header: "Last reading",
          cell: (info) => (
            <span className="whitespace-nowrap">{info.getValue() ? formatDateTime(info.getValue()) : "None yet"}</span>
          ),
        }),
      ]),
    [],
  );

  const table = useServerTable({
    columns,
    data: list.data?.items ?? noRows,
    rowCount: list.data?.total,
    pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
    onPaginationChange: ({ pageIndex, pageSize }) => setPage(pageIndex + 1, pageSize),
    getRowId: (row) => String(row.sensor.id),
  });

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={problemId} className="text-sm font-semibold">
          Show
        </label>
        <select
          id={problemId}
          value={filters.problem}
          onChange={(e) => setProblem(e.target.value)}
          className={cn(controlClasses, "min-h-9 w-auto self-start py-1.5 pr-8 text-sm")}
        >
          <option value="">Every problem</option>
          {SENSOR_PROBLEMS.map((p) => (
            <option key={p} value={p}>
              {sensorProblemLabels[p]}
            </option>
          ))}
        </select>
      </div>
      <DataTable
        table={table}
        caption="Sensors needing attention"
        hideCaption
        noun={{ one: "sensor", many: "sensors" }}
        loading={list.isPending}
        fetching={list.isFetching && !list.isPending}
        error={
          list.isError ? (
            <Alert tone="danger" title="We could not load the sensors">
              {errorMessage(list.error)}
            </Alert>
          ) : undefined
        }
        empty={
          <EmptyState title={filters.problem ? "No sensors with this problem" : "Every sensor is working"}>
            {filters.problem
              ? "Choose Every problem to see all sensors needing attention."
              : "Sensors that stop reporting, run low on battery or send implausible values appear here."}
          </EmptyState>
        }
      />
    </div>
  );
}
