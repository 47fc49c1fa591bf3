import { zodResolver } from "@hookform/resolvers/zod";
import { useCallback, useEffect, useId, useRef, useState, type FormEvent } from "react";
import { Controller, useForm, type FieldErrors, type FieldPath } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Textarea } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/dates";
import {
  AREAS,
  DURATIONS,
  EQUIPMENT_ANSWERS,
  LOCATIONS,
  OBSERVATIONS,
  VULNERABILITIES,
  caseReportSchema,
  type CaseReport,
  type Vulnerability,
} from "@/lib/schemas/case-report";
import type { CreatedCase, HandReading, RoomOption } from "../api/types";
import { clearDraft, emptyReport, isBlank, loadDraft, saveDraft, type HouseholdAnswer, type ReportDraft, type ReportFormValues } from "../lib/draft";
import { sendReport, type SendProgress } from "../lib/send-report";
import {
  EQUIPMENT_QUESTIONS,
  areaLabels,
  choices,
  durationLabels,
  equipmentQuestions,
  householdNoneLabel,
  householdPreferNotLabel,
  locationLabels,
  observationLabels,
  vulnerabilityLabels,
} from "../labels";
import { CheckboxGroup, ExclusiveCheckbox, RadioGroup } from "./choice-fields";
import { LoggerFileFields } from "./csv-import";
import { HandReadingForm } from "./hand-reading-form";
import { PhotoPicker } from "./photo-picker";
import { ReportSummary, Row } from "./report-summary";

type FieldName = FieldPath<ReportFormValues>;

const STEPS: { title: string; fields: FieldName[] }[] = [
  { title: "What you can see, and where", fields: ["description", "locations", "observations", "roomIds"] },
  { title: "How long, and how big", fields: ["since", "area"] },
  { title: "About your home and household", fields: ["equipment", "vulnerability"] },
  { title: "Photos", fields: [] },
  { title: "Readings", fields: [] },
  { title: "Check and send", fields: [] },
];
const PHOTOS_STEP = 3;
const READINGS_STEP = 4;
const LAST_STEP = STEPS.length - 1;
const SAVE_DELAY_MS = 600;

const progressWords: Record<SendProgress, string> = {
  case: "Sending your report…",
  photos: "Your report is sent. Adding your photos…",
  readings: "Adding your readings…",
};

interface ReportFormProps {
  /** Drafts are kept per account, so someone else on this device never sees them. */
  userId: number;
  rooms: readonly RoomOption[];
  /** The case exists: `complete` is false when photos or readings still need a retry. */
  onSent: (created: CreatedCase, complete: boolean) => void;
}

function stepOfField(field: string): number {
  const i = STEPS.findIndex((s) => s.fields.some((f) => field === f || field.startsWith(`${f}.`)));
  return i === -1 ? 0 : i;
}

export function ReportForm({ userId, rooms, onSent }: ReportFormProps) {
  const [restored] = useState<ReportDraft | null>(() => {
    const draft = loadDraft(userId);
    if (!draft || isBlank(draft)) return null;
    // Rooms may have changed since the draft was saved.
    const known = new Set(rooms.map((r) => r.id));
    return {
      ...draft,
      values: { ...draft.values, roomIds: (draft.values.roomIds ?? []).filter((id) => known.has(id)) },
      readings: draft.readings.filter((r) => known.has(r.roomId)),
    };
  });

  const form = useForm<ReportFormValues, unknown, CaseReport>({
    resolver: zodResolver(caseReportSchema),
    defaultValues: restored?.values ?? emptyReport(),
  });
  const { control, register, formState, setValue, getValues, getFieldState, trigger, handleSubmit, setError, reset, watch } = form;
  const errors = formState.errors;

  const [step, setStep] = useState(restored?.step ?? 0);
  const [household, setHousehold] = useState<HouseholdAnswer>(restored?.household ?? null);
  const [readings, setReadings] = useState<HandReading[]>(restored?.readings ?? []);
  const [photos, setPhotos] = useState<File[]>([]);
  const [loggerFile, setLoggerFile] = useState<File | null>(null);
  const [loggerRoom, setLoggerRoom] = useState<number | null>(rooms.length === 1 ? rooms[0]!.id : null);
  const [loggerRoomError, setLoggerRoomError] = useState<string | undefined>();
  const [restoredNote, setRestoredNote] = useState(restored);
  const [confirmRestart, setConfirmRestart] = useState(false);
  const [unaddedReading, setUnaddedReading] = useState(false);
  const [warnedUnadded, setWarnedUnadded] = useState(false);
  const [progress, setProgress] = useState<SendProgress | null>(null);
  const [sendError, setSendError] = useState<string | null>(null);
  const [savedAt, setSavedAt] = useState<string | null>(restored?.savedAt ?? null);
  const [saveFailed, setSaveFailed] = useState(false);

  const headingRef = useRef<HTMLHeadingElement>(null);
  const focusHeading = useRef(false);
  const headingId = useId();

  // ---- Draft: saved a moment after each change, and at once when the page is hidden.
  const latest = useRef({ step, household, readings, photoCount: photos.length, hadLoggerFile: loggerFile !== null });
  latest.current = { step, household, readings, photoCount: photos.length, hadLoggerFile: loggerFile !== null };
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const sent = useRef(false);

  const saveNow = useCallback(() => {
    clearTimeout(timer.current);
    timer.current = undefined;
    if (sent.current) return;
    const draft: ReportDraft = { version: 1, savedAt: new Date().toISOString(), values: getValues(), ...latest.current };
    if (isBlank(draft)) {
      clearDraft(userId);
      return;
    }
    const ok = saveDraft(userId, draft);
    setSaveFailed(!ok);
    if (ok) setSavedAt(draft.savedAt);
  }, [getValues, userId]);

  const scheduleSave = useCallback(() => {
    if (sent.current) return;
    clearTimeout(timer.current);
    timer.current = setTimeout(saveNow, SAVE_DELAY_MS);
  }, [saveNow]);

  useEffect(() => {
    const sub = watch((_values, { name }) => {
      scheduleSave();
      // A field that failed its step's check is checked again as it changes, so the message goes once fixed.
      const top = name?.split(".")[0] as FieldName | undefined;
      if (top && getFieldState(top).error) void trigger(top);
    });
    return () => sub.unsubscribe();
  }, [watch, scheduleSave, getFieldState, trigger]);
  const firstRender = useRef(true);
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    scheduleSave();
  }, [step, household, readings, photos.length, loggerFile, scheduleSave]);
  useEffect(() => {
    const flush = () => {
      if (timer.current !== undefined) saveNow();
    };
    const onVisibility = () => document.visibilityState === "hidden" && flush();
    window.addEventListener("pagehide", flush);
    document.addEventListener("visibilitychange", onVisibility);
    return () => {
      window.removeEventListener("pagehide", flush);
      document.removeEventListener("visibilitychange", onVisibility);
      flush();
    };
  }, [saveNow]);

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
    if (fields.length && !(await trigger(fields, { shouldFocus: true }))) return;
    if (step === READINGS_STEP) {
      if (unaddedReading && !warnedUnadded) {
        setWarnedUnadded(true);
        return;
      }
      if (loggerFile && loggerRoom === null) {
        setLoggerRoomError("Choose where the logger was, or remove the file.");
        return;
      }
    }
    goTo(step + 1);
  };

  const send = async (report: CaseReport) => {
    setSendError(null);
    try {
      const outcome = await sendReport(
        { report, photos, readings, loggerFile: loggerFile ? { file: loggerFile, roomId: loggerRoom } : null },
        setProgress,
      );
      sent.current = true;
      clearTimeout(timer.current);
      clearDraft(userId);
      onSent(outcome.created, outcome.complete);
    } catch (error) {
      setProgress(null);
      if (error instanceof ApiError && error.status === 400 && error.fieldErrors.length) {
        let first = LAST_STEP;
        for (const { field, message } of error.fieldErrors) {
          const name = field as FieldName;
          if (STEPS.some((s) => s.fields.some((f) => name === f || name.startsWith(`${f}.`)))) {
            setError(name, { message });
            first = Math.min(first, stepOfField(name));
          }
        }
        if (first !== LAST_STEP) {
          goTo(first);
          return;
        }
      }
      setSendError(errorMessage(error));
    }
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
    void handleSubmit(send, onInvalid)(event);
  };

  const restart = () => {
    clearTimeout(timer.current);
    clearDraft(userId);
    reset(emptyReport());
    setHousehold(null);
    setReadings([]);
    setPhotos([]);
    setLoggerFile(null);
    setRestoredNote(null);
    setSavedAt(null);
    setConfirmRestart(false);
    goTo(0);
  };

  const setHouseholdList = (list: Vulnerability[]) => {
    // An emptied list goes back to "no answer", never to "none of these".
    setHousehold(list.length ? "list" : null);
    setValue("vulnerability", list.length ? list : undefined, { shouldDirty: true });
  };
  const setHouseholdExclusive = (answer: "none" | "prefer-not", checked: boolean) => {
    setHousehold(checked ? answer : null);
    setValue("vulnerability", checked && answer === "none" ? [] : undefined, { shouldDirty: true });
  };

  const sending = progress !== null;
  const values = watch();
  const roomName = (id: number) => rooms.find((r) => r.id === id)?.name ?? "A room";

  return (
    <div className="flex flex-col gap-5">
      {restoredNote ? (
        <Alert tone="info" title="Welcome back: we kept your answers" live="none">
          <p>You started this report on {formatDateTime(restoredNote.savedAt)}. You can carry on where you left off.</p>
          {restoredNote.photoCount > 0 || restoredNote.hadLoggerFile ? (
            <p className="mt-1">
              Photos and files can't be kept on this device, so please add{" "}
              {restoredNote.photoCount > 0 ? (restoredNote.photoCount === 1 ? "your photo" : `your ${restoredNote.photoCount} photos`) : "your logger file"}{" "}
              again when you get to {restoredNote.photoCount > 0 ? "the photos step" : "the readings step"}.
            </p>
          ) : null}
          <div className="mt-2">
            <Button variant="secondary" size="sm" onClick={() => setConfirmRestart(true)}>
              Start again
            </Button>
          </div>
        </Alert>
      ) : null}

      <form onSubmit={onSubmit} noValidate aria-labelledby={headingId} className="flex flex-col gap-5">
        <div className="flex flex-col gap-2">
          <StepBar step={step} />
          <h2 id={headingId} ref={headingRef} tabIndex={-1} className="flex flex-col text-xl font-bold focus:outline-none">
            <span className="text-sm font-semibold text-ink-soft">
              Step {step + 1} of {STEPS.length}
            </span>
            {STEPS[step]!.title}
          </h2>
        </div>

        {step === 0 ? (
          <div className="flex flex-col gap-6">
            <Textarea
              label="What can you see?"
              hint="In your own words. For example: black spots on the bedroom ceiling, and water on the windows every morning."
              rows={4}
              error={errors.description?.message}
              {...register("description")}
            />
            <Controller
              control={control}
              name="locations"
              render={({ field, fieldState }) => (
                <CheckboxGroup
                  legend="Where is it?"
                  hint="Choose all that apply."
                  columns
                  options={choices(locationLabels, LOCATIONS)}
                  value={field.value}
                  onChange={field.onChange}
                  onBlur={field.onBlur}
                  inputRef={field.ref}
                  error={fieldState.error?.message}
                />
              )}
            />
            <Controller
              control={control}
              name="observations"
              render={({ field, fieldState }) => (
                <CheckboxGroup
                  legend="What have you noticed?"
                  hint="Choose all that apply."
                  columns
                  options={choices(observationLabels, OBSERVATIONS)}
                  value={field.value}
                  onChange={field.onChange}
                  onBlur={field.onBlur}
                  inputRef={field.ref}
                  error={fieldState.error?.message}
                />
              )}
            />
            {rooms.length ? (
              <Controller
                control={control}
                name="roomIds"
                render={({ field, fieldState }) => (
                  <CheckboxGroup
                    legend="Which rooms? (optional)"
                    hint="Choose all that apply."
                    columns
                    options={rooms.map((r) => ({ value: r.id, label: r.name }))}
                    value={field.value}
                    onChange={field.onChange}
                    onBlur={field.onBlur}
                    inputRef={field.ref}
                    error={fieldState.error?.message}
                  />
                )}
              />
            ) : null}
          </div>
        ) : null}

        {step === 1 ? (
          <div className="flex flex-col gap-6">
            <p>A rough idea is fine. You can skip either question.</p>
            <Controller
              control={control}
              name="since"
              render={({ field, fieldState }) => (
                <RadioGroup
                  legend="How long has this been happening?"
                  options={choices(durationLabels, DURATIONS)}
                  value={field.value}
                  onChange={field.onChange}
                  inputRef={field.ref}
                  error={fieldState.error?.message}
                  clearLabel={<>Clear my answer<span className="sr-only">: how long</span></>}
                />
              )}
            />
            <Controller
              control={control}
              name="area"
              render={({ field, fieldState }) => (
                <RadioGroup
                  legend="How big is the biggest patch?"
                  hint="If there is no patch, only water on the windows, you can skip this."
                  options={choices(areaLabels, AREAS)}
                  value={field.value}
                  onChange={field.onChange}
                  inputRef={field.ref}
                  error={fieldState.error?.message}
                  clearLabel={<>Clear my answer<span className="sr-only">: how big</span></>}
                />
              )}
            />
          </div>
        ) : null}

        {step === 2 ? (
          <div className="flex flex-col gap-8">
            <section aria-labelledby={`${headingId}-home`} className="flex flex-col gap-5">
              <h3 id={`${headingId}-home`} className="text-lg font-bold">
                About your home
              </h3>
              <p className="-mt-3">
                These questions are about what is fitted in your home and whether it works. The answers help your landlord find the cause.
                You can skip any of them.
              </p>
              {EQUIPMENT_QUESTIONS.map((q) => (
                <Controller
                  key={q}
                  control={control}
                  name={`equipment.${q}`}
                  render={({ field, fieldState }) => (
                    <RadioGroup
                      legend={equipmentQuestions[q].question}
                      hint={equipmentQuestions[q].hint}
                      options={EQUIPMENT_ANSWERS.map((value) => ({ value, label: equipmentQuestions[q].answers[value] }))}
                      value={field.value}
                      onChange={field.onChange}
                      inputRef={field.ref}
                      error={fieldState.error?.message}
                      clearLabel={
                        <>
                          Clear my answer<span className="sr-only">: {equipmentQuestions[q].question}</span>
                        </>
                      }
                    />
                  )}
                />
              ))}
            </section>
            <section aria-labelledby={`${headingId}-household`} className="flex flex-col gap-3">
              <h3 id={`${headingId}-household`} className="text-lg font-bold">
                About your household
              </h3>
              <p>
                Damp and mould are a bigger risk to some people's health. We ask so your landlord can prioritise, and visit sooner where
                it matters most. You don't have to answer.
              </p>
              <Controller
                control={control}
                name="vulnerability"
                render={({ field, fieldState }) => (
                  <CheckboxGroup
                    legend="Does anyone living in your home fit any of these?"
                    hint="Choose all that apply."
                    options={choices(vulnerabilityLabels, VULNERABILITIES)}
                    value={household === "list" ? field.value : []}
                    onChange={setHouseholdList}
                    inputRef={field.ref}
                    error={fieldState.error?.message}
                    after={
                      <div className="flex flex-col gap-2">
                        <p className="text-sm font-semibold text-ink-soft" aria-hidden="true">
                          or
                        </p>
                        <ExclusiveCheckbox label={householdNoneLabel} checked={household === "none"} onChange={(c) => setHouseholdExclusive("none", c)} />
                        <ExclusiveCheckbox
                          label={householdPreferNotLabel}
                          checked={household === "prefer-not"}
                          onChange={(c) => setHouseholdExclusive("prefer-not", c)}
                        />
                      </div>
                    }
                  />
                )}
              />
            </section>
          </div>
        ) : null}

        {step === PHOTOS_STEP ? (
          <div className="flex flex-col gap-4">
            <p>
              Photos help your landlord see what you see. If you can, take one close up and one from further back, in daylight. Photos
              are optional.
            </p>
            <PhotoPicker value={photos} onChange={setPhotos} disabled={sending} />
            <p className="text-sm text-ink-soft">
              Your other answers are kept on this device as you go, but photos can't be. If you leave before sending, you'll need to add
              them again.
            </p>
          </div>
        ) : null}

        {step === READINGS_STEP ? (
          <div className="flex flex-col gap-6">
            <p>
              If you have a thermometer and a humidity meter, or a logger that records them, readings can help find the cause. They are
              optional: your landlord will look into your report whatever the readings say.
            </p>
            <section aria-labelledby={`${headingId}-hand`} className="flex flex-col gap-3">
              <h3 id={`${headingId}-hand`} className="text-lg font-bold">
                A reading by hand
              </h3>
              {readings.length ? (
                <div className="flex flex-col gap-2">
                  <h4 className="font-bold">Readings you've added ({readings.length})</h4>
                  <ul className="flex flex-col gap-2">
                    {readings.map((r, i) => (
                      <li key={`${r.roomId}-${r.takenAt}-${i}`} className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-line bg-paper px-3 py-2">
                        <span>
                          <span className="font-semibold">{roomName(r.roomId)}</span>, {formatDateTime(r.takenAt)}: {r.airTemperatureC} °C,{" "}
                          {r.relativeHumidityPct} %{r.surfaceTemperatureC !== undefined ? `, surface ${r.surfaceTemperatureC} °C` : ""}
                          {r.outdoorTemperatureC !== undefined ? `, outdoors ${r.outdoorTemperatureC} °C` : ""}
                        </span>
                        <Button variant="ghost" size="sm" onClick={() => setReadings((list) => list.filter((_, k) => k !== i))}>
                          Remove<span className="sr-only"> reading {i + 1}</span>
                        </Button>
                      </li>
                    ))}
                  </ul>
                </div>
              ) : null}
              <HandReadingForm
                rooms={rooms}
                headingLevel={4}
                onDirtyChange={setUnaddedReading}
                onAdd={(reading) => {
                  setReadings((list) => [...list, reading]);
                  setWarnedUnadded(false);
                }}
              />
              {warnedUnadded ? (
                <Alert tone="warning" title="You have typed a reading that isn't added yet" live="alert">
                  Choose “Add this reading” to keep it. To go on without it, choose Next again.
                </Alert>
              ) : null}
            </section>
            <section aria-labelledby={`${headingId}-file`} className="flex flex-col gap-3">
              <h3 id={`${headingId}-file`} className="text-lg font-bold">
                Readings from a logger
              </h3>
              <LoggerFileFields
                rooms={rooms}
                file={loggerFile}
                roomId={loggerRoom}
                onFileChange={setLoggerFile}
                onRoomChange={(r) => {
                  setLoggerRoom(r);
                  setLoggerRoomError(undefined);
                }}
                roomError={loggerRoomError}
              />
              {loggerFile ? (
                <div className="flex flex-col items-start gap-2">
                  <p className="text-sm">
                    After you send your report, we'll show you the first rows of this file so you can check which column is which before
                    the readings are added.
                  </p>
                  <Button variant="ghost" size="sm" onClick={() => setLoggerFile(null)}>
                    Remove the file
                  </Button>
                </div>
              ) : null}
            </section>
          </div>
        ) : null}

        {step === LAST_STEP ? (
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
                  <Row term="Photos" value={photos.length ? `${photos.length} ${photos.length === 1 ? "photo" : "photos"}` : "None"} step={PHOTOS_STEP} onChange={goTo} />
                  <Row
                    term="Readings"
                    value={[
                      readings.length ? `${readings.length} ${readings.length === 1 ? "reading" : "readings"} by hand` : "No readings by hand",
                      loggerFile ? `Logger file: ${loggerFile.name}` : "No logger file",
                    ]}
                    step={READINGS_STEP}
                    onChange={goTo}
                  />
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
        ) : null}

        <div className="flex flex-col gap-3 border-t border-line pt-4">
          <div className={cn("flex flex-wrap gap-3", step === 0 ? "justify-end" : "justify-between")}>
            {step > 0 ? (
              <Button variant="secondary" size="lg" onClick={() => goTo(step - 1)} disabled={sending}>
                Back
              </Button>
            ) : null}
            {step < LAST_STEP ? (
              <Button type="submit" size="lg">
                Next
              </Button>
            ) : (
              <Button type="submit" size="lg" busy={sending}>
                Send report
              </Button>
            )}
          </div>
          <p role="status" className="text-sm font-semibold">
            {progress ? progressWords[progress] : null}
          </p>
          <p className="text-sm text-ink-soft">
            {saveFailed
              ? "We couldn't keep a copy of your answers on this device, so please send the report before you close this page."
              : savedAt
                ? `Your answers are kept on this device as you go (last kept at ${formatDateTime(savedAt)}).`
                : "Your answers are kept on this device as you go, until you send the report."}
          </p>
        </div>
      </form>

      <ConfirmDialog
        open={confirmRestart}
        title="Start a new report?"
        confirmLabel="Clear my answers"
        cancelLabel="Keep my answers"
        tone="danger"
        onConfirm={restart}
        onCancel={() => setConfirmRestart(false)}
      >
        This clears the answers you've given so far from this device.
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
