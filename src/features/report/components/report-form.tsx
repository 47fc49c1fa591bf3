import { useEffect, useId, useRef, useState, type FormEvent } from "react";
import type { FieldErrors } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { useTranslation } from "react-i18next";
import { formatDateTimeIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import type { CaseReport } from "@/lib/schemas/case-report";
import type { CreatedCase, RoomOption } from "../api/types";
import { useReportDraft } from "../hooks/use-report-draft";
import type { ReportFormValues } from "../lib/draft";
import { enqueueReport, removeQueued, sendQueued } from "../lib/report-queue";
import { startFollowUp } from "../lib/follow-up";
import { sendReport, type SendProgress } from "../lib/send-report";
import { LAST_STEP, PHOTOS_STEP, READINGS_STEP, STEPS, isStepField, stepOfField, type FieldName } from "../lib/steps";
import { CheckStep } from "./steps/check-step";
import { DescribeStep } from "./steps/describe-step";
import { ExtentStep } from "./steps/extent-step";
import { HomeStep } from "./steps/home-step";
import { PhotosStep } from "./steps/photos-step";
import { ReadingsStep } from "./steps/readings-step";

const progressWords = {
  case: "form.sending",
  photos: "form.sendingPhotos",
  readings: "form.sendingReadings",
} as const satisfies Record<SendProgress, string>;

interface ReportFormProps {
  /** Drafts are kept per account, so someone else on this device never sees them. */
  userId: number;
  rooms: readonly RoomOption[];
  /**
   * The case exists: `complete` is false when photos or readings still need a retry; `created` is
   * null when an earlier try made it and its answer was lost (it is on the tenant's list).
   */
  onSent: (created: CreatedCase | null, complete: boolean) => void;
  /** No signal (or the send failed on the way): the report is kept on this phone and sends later. */
  onQueued: () => void;
}

/**
 * The tenant's report, one step at a time. The answers and their copy on this device belong to
 * `useReportDraft`; this component moves between the steps, checks each before going on, and sends.
 */
export function ReportForm({ userId, rooms, onSent, onQueued }: ReportFormProps) {
  const { t, i18n: active } = useTranslation("report", { i18n });
  const when = (iso: string) => formatDateTimeIn(active.language, iso);
  const draft = useReportDraft(userId, rooms);
  const { form, step, setStep, photos, readings, logger, restoredNote } = draft;

  const [loggerRoomError, setLoggerRoomError] = useState<string | undefined>();
  const [confirmRestart, setConfirmRestart] = useState(false);
  const [unaddedReading, setUnaddedReading] = useState(false);
  const [warnedUnadded, setWarnedUnadded] = useState(false);
  const [progress, setProgress] = useState<SendProgress | null>(null);
  const [sendError, setSendError] = useState<string | null>(null);

  const headingRef = useRef<HTMLHeadingElement>(null);
  const focusHeading = useRef(false);
  const headingId = useId();

  // ---- Steps: focus goes to the new step's heading, so everyone starts at its top.
  const goTo = (next: number) => {
    focusHeading.current = true;
    setWarnedUnadded(false);
    setStep(Math.max(0, Math.min(LAST_STEP, next)));
  };
  useEffect(() => {
    if (!focusHeading.current) return;
    focusHeading.current = false;
    headingRef.current?.focus();
  }, [step]);

  const next = async () => {
    const fields = STEPS[step]!.fields;
    if (fields.length && !(await form.trigger(fields, { shouldFocus: true }))) return;
    if (step === READINGS_STEP) {
      if (unaddedReading && !warnedUnadded) {
        setWarnedUnadded(true);
        return;
      }
      if (logger.file && logger.roomId === null) {
        setLoggerRoomError(t("form.loggerRoomMissing"));
        return;
      }
    }
    goTo(step + 1);
  };

  const send = async (report: CaseReport) => {
    setSendError(null);
    const input = { report, photos, readings, loggerFile: logger.file ? { file: logger.file, roomId: logger.roomId } : null };
    // The report is kept on this phone (photos too) before the first try, so no signal, a dropped
    // connection or a closed tab loses nothing; it leaves the phone once every part has gone.
    const queued = await enqueueReport(userId, input).catch(() => null);
    if (queued) {
      setProgress("case");
      const result = await sendQueued(queued.id, setProgress);
      if (result.kind === "sent") {
        draft.markSent();
        const { caseId, refusedPhotos, photosDone } = result.report;
        const created = result.created;
        if (!created || caseId === undefined) {
          // Made by an earlier try whose answer was lost: it is with the landlord, on the list.
          onSent(null, true);
          return;
        }
        // The case page shows refused photos and asks for the logger file's columns, as before.
        startFollowUp({
          caseId,
          photos: photosDone
            ? { files: [], status: "done", added: photos.length - (refusedPhotos?.length ?? 0), refused: refusedPhotos }
            : undefined,
          loggerFile: input.loggerFile ? { ...input.loggerFile, status: "waiting" } : undefined,
        });
        onSent(created, true);
        return;
      }
      // The case could not be made and the form is still here to fix it: the kept copy goes, the
      // server's reason is shown at the question it is about.
      const beforeCase = result.kind === "refused" && result.report.caseId === undefined;
      if (!beforeCase) {
        draft.markSent();
        onQueued();
        return;
      }
      await removeQueued(queued.id);
      setProgress(null);
      showRefusal(result.error);
      return;
    }
    // This device cannot keep it (no IndexedDB): send it straight away, as one try.
    try {
      const outcome = await sendReport(input, setProgress);
      draft.markSent();
      onSent(outcome.created, outcome.complete);
    } catch (error) {
      setProgress(null);
      showRefusal(error);
    }
  };

  const showRefusal = (error: unknown) => {
    if (error instanceof ApiError && error.status === 400 && error.fieldErrors.length) {
      let first = LAST_STEP;
      for (const { field, message } of error.fieldErrors) {
        if (isStepField(field)) {
          form.setError(field as FieldName, { message });
          first = Math.min(first, stepOfField(field));
        }
      }
      if (first !== LAST_STEP) {
        goTo(first);
        return;
      }
    }
    setSendError(errorMessage(error));
  };

  const onInvalid = (found: FieldErrors<ReportFormValues>) => {
    const first = STEPS.findIndex((s) => s.fields.some((f) => f in found));
    goTo(first === -1 ? 0 : first);
  };

  // Enter or "Next" moves on a step after checking it; only the last step sends.
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    if (step < LAST_STEP) {
      event.preventDefault();
      void next();
      return;
    }
    void form.handleSubmit(send, onInvalid)(event);
  };

  const restart = () => {
    draft.restart();
    setConfirmRestart(false);
    goTo(0);
  };

  const sending = progress !== null;

  return (
    <div className="flex flex-col gap-5">
      {restoredNote ? (
        <Alert tone="info" title={t("form.restoredTitle")} live="none">
          <p>{t("form.restoredBody", { when: when(restoredNote.savedAt) })}</p>
          {restoredNote.photoCount > 0 || restoredNote.hadLoggerFile ? (
            <p className="mt-1">
              {restoredNote.photoCount > 0
                ? t("form.restoredPhotos", { photos: restoredNote.photoCount })
                : t("form.restoredLogger")}
            </p>
          ) : null}
          <div className="mt-2">
            <Button variant="secondary" size="sm" onClick={() => setConfirmRestart(true)}>
              {t("form.startAgain")}
            </Button>
          </div>
        </Alert>
      ) : null}

      <form onSubmit={onSubmit} noValidate aria-labelledby={headingId} className="flex flex-col gap-5">
        <div className="flex flex-col gap-2">
          <StepBar step={step} />
          <h2 id={headingId} ref={headingRef} tabIndex={-1} className="flex flex-col text-xl font-bold focus:outline-none">
            <span className="text-sm font-semibold text-ink-soft">
              {t("steps.progress", { step: step + 1, total: STEPS.length })}
            </span>
            {t(`steps.${STEPS[step]!.title}`)}
          </h2>
        </div>

        {step === 0 ? <DescribeStep form={form} rooms={rooms} /> : null}
        {step === 1 ? <ExtentStep control={form.control} /> : null}
        {step === 2 ? <HomeStep {...draft} headingId={headingId} /> : null}
        {step === PHOTOS_STEP ? <PhotosStep photos={photos} onChange={draft.setPhotos} disabled={sending} /> : null}
        {step === READINGS_STEP ? (
          <ReadingsStep
            {...draft}
            rooms={rooms}
            headingId={headingId}
            onUnaddedChange={setUnaddedReading}
            warnedUnadded={warnedUnadded}
            onAdded={() => setWarnedUnadded(false)}
            loggerRoomError={loggerRoomError}
            onLoggerRoomChosen={() => setLoggerRoomError(undefined)}
          />
        ) : null}
        {step === LAST_STEP ? <CheckStep {...draft} rooms={rooms} goTo={goTo} sendError={sendError} /> : null}

        <div className="flex flex-col gap-3 border-t border-line pt-4">
          <div className={cn("flex flex-wrap gap-3", step === 0 ? "justify-end" : "justify-between")}>
            {step > 0 ? (
              <Button variant="secondary" size="lg" onClick={() => goTo(step - 1)} disabled={sending}>
                {t("form.back")}
              </Button>
            ) : null}
            {step < LAST_STEP ? (
              <Button type="submit" size="lg">
                {t("form.next")}
              </Button>
            ) : (
              <Button type="submit" size="lg" busy={sending}>
                {t("form.send")}
              </Button>
            )}
          </div>
          <p role="status" className="text-sm font-semibold">
            {progress ? t(progressWords[progress]) : null}
          </p>
          <p className="text-sm text-ink-soft">
            {draft.saveFailed
              ? t("form.saveFailed")
              : draft.savedAt
                ? t("form.savedAt", { when: when(draft.savedAt) })
                : t("form.keptAsYouGo")}
          </p>
        </div>
      </form>

      <ConfirmDialog
        open={confirmRestart}
        title={t("form.restartTitle")}
        confirmLabel={t("form.restartConfirm")}
        cancelLabel={t("form.restartCancel")}
        tone="danger"
        onConfirm={restart}
        onCancel={() => setConfirmRestart(false)}
      >
        {t("form.restartBody")}
      </ConfirmDialog>
    </div>
  );
}

function StepBar({ step }: { step: number }) {
  return (
    <div aria-hidden="true" className="flex gap-1">
      {STEPS.map((s, i) => (
        <span key={s.title} className={cn("h-1.5 flex-1 rounded-pill", i <= step ? "bg-dew-700" : "bg-line")} />
      ))}
    </div>
  );
}
