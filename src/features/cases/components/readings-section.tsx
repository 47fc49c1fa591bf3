import { useId, useMemo, useState } from "react";
import { ExportLinks } from "@/components/ui/export-links";
import { Select } from "@/components/ui/field";
import type { CaseReading, CaseRoom } from "../api/types";
import { ReadingsChart } from "./readings-chart";
import { ReadingsTable } from "./readings-table";

interface ReadingsSectionProps {
  readings: readonly CaseReading[];
  rooms: readonly CaseRoom[];
  /** Staff: the case's readings export under /api (e.g. "/cases/12/readings/export"), offered for the room shown. */
  exportPath?: string;
}

/** One room at a time: its chart, then its readings in a table. */
export function ReadingsSection({ readings, rooms, exportPath }: ReadingsSectionProps) {
  const id = useId();
  const withReadings = useMemo(() => {
    const ids = new Set(readings.map((r) => r.roomId));
    const known = rooms.filter((r) => ids.has(r.id));
    // Readings for a room this view has no name for still show.
    for (const roomId of ids)
      if (!known.some((r) => r.id === roomId)) known.push({ id: roomId, name: `Room ${roomId}`, kind: "other" });
    return known;
  }, [readings, rooms]);
  const [chosen, setChosen] = useState<number | null>(null);
  const roomId = chosen !== null && withReadings.some((r) => r.id === chosen) ? chosen : (withReadings[0]?.id ?? null);
  const shown = useMemo(() => readings.filter((r) => r.roomId === roomId), [readings, roomId]);
  const room = withReadings.find((r) => r.id === roomId);

  if (readings.length === 0) return <p className="text-ink-soft">No readings yet.</p>;

  return (
    <div className="flex flex-col gap-4">
      {withReadings.length > 1 ? (
        <Select
          id={`${id}-room`}
          label="Show readings for"
          value={String(roomId)}
          onChange={(e) => setChosen(Number(e.target.value))}
          controlClassName="sm:max-w-xs"
        >
          {withReadings.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </Select>
      ) : null}
      <ReadingsChart readings={shown} title={`Readings in ${room?.name ?? "this room"}`} />
      <ReadingsTable readings={shown} rooms={rooms} caption={`Readings in ${room?.name ?? "this room"}, newest first`} />
      {exportPath && roomId !== null ? (
        <ExportLinks path={exportPath} query={{ roomId }} what={`readings in ${room?.name ?? "this room"}`} />
      ) : null}
    </div>
  );
}
