import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { formatDateTimeIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
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
  const { t, i18n: active } = useTranslation("report", { i18n });
  const roomName = (id: number) => p.rooms.find((r) => r.id === id)?.name ?? t("form.aRoom");
  return (
    <div className="flex flex-col gap-6">
      <p>{t("readings.intro")}</p>
      <section aria-labelledby={`${p.headingId}-hand`} className="flex flex-col gap-3">
        <h3 id={`${p.headingId}-hand`} className="text-lg font-bold">
          {t("readings.byHand")}
        </h3>
        {p.readings.length ? (
          <div className="flex flex-col gap-2">
            <h4 className="font-bold">{t("readings.added", { count: p.readings.length })}</h4>
            <ul className="flex flex-col gap-2">
              {p.readings.map((r, i) => (
                <li
                  key={`${r.roomId}-${r.takenAt}-${i}`}
                  className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-line bg-paper px-3 py-2"
                >
                  <span>
                    <span className="font-semibold" translate="no">
                      {roomName(r.roomId)}
                    </span>
                    , {formatDateTimeIn(active.language, r.takenAt)}:{" "}
                    {[
                      t("readings.summary", { air: r.airTemperatureC, rh: r.relativeHumidityPct }),
                      r.surfaceTemperatureC !== undefined ? t("readings.summarySurface", { t: r.surfaceTemperatureC }) : null,
                      r.outdoorTemperatureC !== undefined ? t("readings.summaryOutdoor", { t: r.outdoorTemperatureC }) : null,
                    ]
                      .filter(Boolean)
                      .join(", ")}
                  </span>
                  <Button variant="ghost" size="sm" onClick={() => p.removeReading(i)}>
                    {t("readings.remove")}
                    <span className="sr-only"> {t("readings.removeWhich", { n: i + 1 })}</span>
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
          <Alert tone="warning" title={t("readings.unaddedTitle")} live="alert">
            {t("readings.unaddedBody")}
          </Alert>
        ) : null}
      </section>
      <section aria-labelledby={`${p.headingId}-file`} className="flex flex-col gap-3">
        <h3 id={`${p.headingId}-file`} className="text-lg font-bold">
          {t("readings.fromLogger")}
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
            <p className="text-sm">{t("readings.loggerAfter")}</p>
            <Button variant="ghost" size="sm" onClick={() => p.setLoggerFile(null)}>
              {t("readings.removeFile")}
            </Button>
          </div>
        ) : null}
      </section>
    </div>
  );
}
