import { Alert } from "@/components/ui/alert";
import type { RoomOption } from "../../api/types";
import type { ReportDraftState } from "../../hooks/use-report-draft";
import { PHOTOS_STEP, READINGS_STEP } from "../../lib/steps";
import { ReportSummary, Row, SummaryCard } from "../report-summary";

type CheckStepProps = Pick<ReportDraftState, "form" | "household" | "photos" | "readings" | "logger"> & {
  rooms: readonly RoomOption[];
  goTo: (step: number) => void;
  sendError: string | null;
};

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The last step: every answer to check, each with a way back to change it, before sending. */
export function CheckStep({ form, household, photos, readings, logger, rooms, goTo, sendError }: CheckStepProps) {
  const values = form.watch();
  const roomName = (id: number) => rooms.find((r) => r.id === id)?.name ?? "A room";
  return (
    <div className="flex flex-col gap-4">
      <p>Please check your answers. You can change any of them before you send.</p>
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
            <SummaryCard title="Photos" step={PHOTOS_STEP} onChange={goTo}>
              <Row term="Photos to send" value={photos.length ? count(photos.length, "photo", "photos") : "None"} />
            </SummaryCard>
            <SummaryCard title="Readings" step={READINGS_STEP} onChange={goTo}>
              <Row term="Readings by hand" value={readings.length ? count(readings.length, "reading", "readings") : "None"} />
              <Row term="Logger file" value={logger.file ? logger.file.name : "None"} />
            </SummaryCard>
          </>
        }
      />
      <p>When you send this report, your landlord is told straight away. They will look into it whatever any readings say.</p>
      {sendError ? (
        <Alert tone="danger" title="Your report has not been sent yet">
          <p>{sendError}</p>
          <p className="mt-1">Your answers are kept on this device, so nothing is lost. Please try again.</p>
        </Alert>
      ) : null}
    </div>
  );
}
