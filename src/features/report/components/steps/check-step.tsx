import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { i18n } from "@/lib/i18n/i18n";
import type { RoomOption } from "../../api/types";
import type { ReportDraftState } from "../../hooks/use-report-draft";
import { PHOTOS_STEP, READINGS_STEP } from "../../lib/steps";
import { ReportSummary, Row, SummaryCard } from "../report-summary";

type CheckStepProps = Pick<ReportDraftState, "form" | "household" | "photos" | "readings" | "logger"> & {
  rooms: readonly RoomOption[];
  goTo: (step: number) => void;
  sendError: string | null;
};

/** The last step: every answer to check, each with a way back to change it, before sending. */
export function CheckStep({ form, household, photos, readings, logger, rooms, goTo, sendError }: CheckStepProps) {
  const { t } = useTranslation("report", { i18n });
  const values = form.watch();
  const roomName = (id: number) => rooms.find((r) => r.id === id)?.name ?? t("form.aRoom");
  return (
    <div className="flex flex-col gap-4">
      <p>{t("check.intro")}</p>
      <ReportSummary
        onChange={goTo}
        answers={{
          description: values.description ?? "",
          locations: values.locations ?? [],
          observations: values.observations ?? [],
          roomNames: (values.roomIds ?? []).map(roomName),
          since: values.since,
          area: values.area,
          vulnerability: household === "none" ? [] : household === "list" ? values.vulnerability : undefined,
          householdDeclined: household === "prefer-not",
          equipment: values.equipment,
        }}
        extra={
          <>
            <SummaryCard title={t("steps.photos")} step={PHOTOS_STEP} onChange={goTo}>
              <Row
                term={t("check.photosToSend")}
                value={photos.length ? t("check.photoCount", { count: photos.length }) : t("check.none")}
              />
            </SummaryCard>
            <SummaryCard title={t("steps.readings")} step={READINGS_STEP} onChange={goTo}>
              <Row
                term={t("check.readingsByHand")}
                value={readings.length ? t("check.readingCount", { count: readings.length }) : t("check.none")}
              />
              <Row
                term={t("check.loggerFile")}
                value={logger.file ? logger.file.name : t("check.none")}
                data={Boolean(logger.file)}
              />
            </SummaryCard>
          </>
        }
      />
      <p>{t("check.sendNote")}</p>
      {sendError ? (
        <Alert tone="danger" title={t("check.notSentTitle")}>
          <p>{sendError}</p>
          <p className="mt-1">{t("check.notSentBody")}</p>
        </Alert>
      ) : null}
    </div>
  );
}
