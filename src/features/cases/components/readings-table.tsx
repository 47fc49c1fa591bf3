import { useMemo, useState } from "react";
import { DataTable, dataTableColumnHelper, useServerTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/lib/dates";
import { fixed, surfaceHumidity } from "@/lib/domain/wording";
import type { CaseReading, CaseRoom } from "../api/types";
import { sourceLabels } from "../labels";
import { derive, type Derived } from "../lib/derived";

type Row = CaseReading & Derived & { roomName: string };

const column = dataTableColumnHelper<Row>();
const dash = "—";
const celsius = (v: number | null) => (v === null ? dash : `${fixed(v, 1)} °C`);
const pct = (v: number | null) => (v === null ? dash : `${fixed(v, 0)} %`);
const surfacePct = (v: number | null) => (v === null ? dash : surfaceHumidity(v));

const roomColumn = column.accessor("roomName", {
  header: "Room",
  cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span>,
});

const columns = column.columns([
  column.accessor("takenAt", {
    header: "Taken",
    cell: (info) => <span className="whitespace-nowrap">{formatDateTime(info.getValue())}</span>,
  }),
  column.accessor("airTemperatureC", {
    header: "Air",
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{celsius(info.getValue())}</span>,
  }),
  column.accessor("relativeHumidityPct", {
    header: "Humidity",
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{pct(info.getValue())}</span>,
  }),
  column.accessor("dewPointC", {
    header: "Dew point",
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{celsius(info.getValue())}</span>,
  }),
  column.accessor("surfaceTemperatureC", {
    header: "Surface",
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{celsius(info.getValue())}</span>,
  }),
  column.accessor("surfaceRhPct", {
    header: "Surface humidity",
    cell: (info) => <span className="tabular-nums">{surfacePct(info.getValue())}</span>,
  }),
  column.accessor("outdoorTemperatureC", {
    header: "Outdoors",
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{celsius(info.getValue())}</span>,
  }),
  column.accessor("source", { header: "From", cell: (info) => sourceLabels[info.getValue()] ?? info.getValue() }),
]);

interface ReadingsTableProps {
  readings: readonly CaseReading[];
  rooms: readonly CaseRoom[];
  caption?: string;
  /** A column naming the room, for a table that mixes rooms. */
  showRoom?: boolean;
}

/** Newest first, a page at a time; dew point and surface humidity are worked out only for the rows shown. */
const columnsWithRoom = [columns[0]!, roomColumn, ...columns.slice(1)];

export function ReadingsTable({ readings, rooms, caption = "Readings", showRoom = false }: ReadingsTableProps) {
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: 25 });
  const newestFirst = useMemo(() => [...readings].reverse(), [readings]);
  const pageCount = Math.max(1, Math.ceil(newestFirst.length / pagination.pageSize));
  const pageIndex = Math.min(pagination.pageIndex, pageCount - 1);
  const rows = useMemo(() => {
    const names = new Map(rooms.map((r) => [r.id, r.name]));
    return newestFirst
      .slice(pageIndex * pagination.pageSize, (pageIndex + 1) * pagination.pageSize)
      .map((r) => ({ ...r, ...derive(r), roomName: names.get(r.roomId) ?? `Room ${r.roomId}` }));
  }, [newestFirst, rooms, pageIndex, pagination.pageSize]);

  const table = useServerTable({
    columns: showRoom ? columnsWithRoom : columns,
    data: rows,
    rowCount: newestFirst.length,
    pagination: { pageIndex, pageSize: pagination.pageSize },
    onPaginationChange: setPagination,
    getRowId: (row) => String(row.id),
  });

  return (
    <DataTable
      table={table}
      caption={caption}
      noun={{ one: "reading", many: "readings" }}
      empty={<EmptyState title="No readings yet" />}
    />
  );
}
