import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { formatDateTime } from "@/lib/dates";
import type { RoomOption } from "../../api/types";
import type { ReportDraftState } from "../../hooks/use-report-draft";
import { LoggerFileFields } from "../csv-import";
import { HandReadingForm } from "../hand-reading-form";

type ReadingsStepProps = Pick<
  ReportDraftState,
  "readings" | "addReading" | "removeReading" | "logger" | "setLoggerFile" | "setLoggerRoom"
> & {
  rooms: readonly RoomOption[];
  headingId: string;
  /** A reading is typed but not added yet. */
  onUnaddedChange: (unadded: boolean) => void;
  /** Next was chosen with a reading typed but not added: say so once. */
  warnedUnadded: boolean;
  onAdded: () => void;
  loggerRoomError: string | undefined;
  onLoggerRoomChosen: () => void;
};

/** Step 5: readings by hand and a logger's file, optional; the landlord looks into the report whatever they say. */
export function ReadingsStep(p: ReadingsStepProps) {
  const roomName = (id: number) => p.rooms.find((r) => r.id === id)?.name ?? "A room";
  return (
    <div className="flex flex-col gap-6">
      <p>
        If you have a thermometer and a humidity meter, or a logger that records them, readings can help find the cause. They are
        optional: your landlord will look into your report whatever the readings say.
      </p>
      <section aria-labelledby={`${p.headingId}-hand`} className="flex flex-col gap-3">
        <h3 id={`${p.headingId}-hand`} className="text-lg font-bold">
          A reading by hand
        </h3>
        {p.readings.length ? (
          <div className="flex flex-col gap-2">
            <h4 className="font-bold">Readings you've added ({p.readings.length})</h4>
            <ul className="flex flex-col gap-2">
              {p.readings.map((r, i) => (
                <li
                  key={`${r.roomId}-${r.takenAt}-${i}`}
                  className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-line bg-paper px-3 py-2"
                >
                  <span>
                    <span className="font-semibold">{roomName(r.roomId)}</span>, {formatDateTime(r.takenAt)}: {r.airTemperatureC}{" "}
                    °C, {r.relativeHumidityPct} %
                    {r.surfaceTemperatureC !== undefined ? `, surface ${r.surfaceTemperatureC} °C` : ""}
                    {r.outdoorTemperatureC !== undefined ? `, outdoors ${r.outdoorTemperatureC} °C` : ""}
                  </span>
                  <Button variant="ghost" size="sm" onClick={() => p.removeReading(i)}>
                    Remove<span className="sr-only"> reading {i + 1}</span>
                  </Button>
                </li>
              ))}
            </ul>
          </div>
        ) : null}
        <HandReadingForm
          rooms={p.rooms}
          headingLevel={4}
          onDirtyChange={p.onUnaddedChange}
          onAdd={(reading) => {
            p.addReading(reading);
            p.onAdded();
          }}
        />
        {p.warnedUnadded ? (
          <Alert tone="warning" title="You have typed a reading that isn't added yet" live="alert">
            Choose “Add this reading” to keep it. To go on without it, choose Next again.
          </Alert>
        ) : null}
      </section>
      <section aria-labelledby={`${p.headingId}-file`} className="flex flex-col gap-3">
        <h3 id={`${p.headingId}-file`} className="text-lg font-bold">
          Readings from a logger
        </h3>
        <LoggerFileFields
          rooms={p.rooms}
          file={p.logger.file}
          roomId={p.logger.roomId}
          onFileChange={p.setLoggerFile}
          onRoomChange={(r) => {
            p.setLoggerRoom(r);
            p.onLoggerRoomChosen();
          }}
          roomError={p.loggerRoomError}
        />
        {p.logger.file ? (
          <div className="flex flex-col items-start gap-2">
            <p className="text-sm">
              After you send your report, we'll show you the first rows of this file so you can check which column is which before
              the readings are added.
            </p>
            <Button variant="ghost" size="sm" onClick={() => p.setLoggerFile(null)}>
              Remove the file
            </Button>
          </div>
        ) : null}
      </section>
    </div>
  );
}
