// The report in progress: the form's answers, the step, the household answer, the readings, photos
// and logger file, and the copy kept on this device (lib/draft.ts) — saved a moment after each
// change and at once when the page is hidden, offered back next time, cleared once sent.
import { zodResolver } from "@hookform/resolvers/zod";
import { useCallback, useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { caseReportSchema, type CaseReport, type Vulnerability } from "@/lib/schemas/case-report";
import type { HandReading, RoomOption } from "../api/types";
import {
  clearDraft,
  emptyReport,
  isBlank,
  loadDraft,
  saveDraft,
  type HouseholdAnswer,
  type ReportDraft,
  type ReportFormValues,
} from "../lib/draft";
import type { FieldName } from "../lib/steps";

const SAVE_DELAY_MS = 600;

/** The draft kept on this device, with rooms that no longer exist left out. */
function restoreDraft(userId: number, rooms: readonly RoomOption[]): ReportDraft | null {
  const draft = loadDraft(userId);
  if (!draft || isBlank(draft)) return null;
  const known = new Set(rooms.map((r) => r.id));
  return {
    ...draft,
    values: { ...draft.values, roomIds: (draft.values.roomIds ?? []).filter((id) => known.has(id)) },
    readings: draft.readings.filter((r) => known.has(r.roomId)),
  };
}

export interface LoggerChoice {
  file: File | null;
  roomId: number | null;
}

export function useReportDraft(userId: number, rooms: readonly RoomOption[]) {
  const [restored] = useState(() => restoreDraft(userId, rooms));
  const form = useForm<ReportFormValues, unknown, CaseReport>({
    resolver: zodResolver(caseReportSchema),
    defaultValues: restored?.values ?? emptyReport(),
  });
  const { getValues, getFieldState, trigger, setValue, reset, watch } = form;

  const [step, setStep] = useState(restored?.step ?? 0);
  const [household, setHousehold] = useState<HouseholdAnswer>(restored?.household ?? null);
  const [readings, setReadings] = useState<HandReading[]>(restored?.readings ?? []);
  const [photos, setPhotos] = useState<File[]>([]);
  const [logger, setLogger] = useState<LoggerChoice>({ file: null, roomId: rooms.length === 1 ? rooms[0]!.id : null });
  /** The draft offered back when the page opened, until the tenant starts again. */
  const [restoredNote, setRestoredNote] = useState(restored);
  const [saved, setSaved] = useState<{ at: string | null; failed: boolean }>({ at: restored?.savedAt ?? null, failed: false });

  // ---- Persistence: saved a moment after each change, and at once when the page is hidden.
  const latest = useRef({ step, household, readings, photoCount: photos.length, hadLoggerFile: logger.file !== null });
  latest.current = { step, household, readings, photoCount: photos.length, hadLoggerFile: logger.file !== null };
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
    setSaved((s) => (ok ? { at: draft.savedAt, failed: false } : { ...s, failed: true }));
  }, [getValues, userId]);

  const scheduleSave = useCallback(() => {
    if (sent.current) return;
    clearTimeout(timer.current);
    timer.current = setTimeout(saveNow, SAVE_DELAY_MS);
  }, [saveNow]);

  useEffect(() => {
    // watch() with a callback is react-hook-form's change subscription, made and ended in this effect
    // and never read during render; useWatch would re-render the whole form on every keystroke and
    // does not say which field changed, and subscribe() also calls back on updates without values.
    // eslint-disable-next-line react-hooks/incompatible-library -- a subscription in an effect, not a value memoized in render
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
  }, [step, household, readings, photos.length, logger.file, scheduleSave]);

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

  // ---- The household question: a list, "none of these", or "prefer not to say".
  const setHouseholdList = (list: Vulnerability[]) => {
    // An emptied list goes back to "no answer", never to "none of these".
    setHousehold(list.length ? "list" : null);
    setValue("vulnerability", list.length ? list : undefined, { shouldDirty: true });
  };
  const setHouseholdExclusive = (answer: "none" | "prefer-not", checked: boolean) => {
    setHousehold(checked ? answer : null);
    setValue("vulnerability", checked && answer === "none" ? [] : undefined, { shouldDirty: true });
  };

  /** Forget every answer, here and on this device. */
  const restart = () => {
    clearTimeout(timer.current);
    clearDraft(userId);
    reset(emptyReport());
    setHousehold(null);
    setReadings([]);
    setPhotos([]);
    setLogger((l) => ({ ...l, file: null }));
    setRestoredNote(null);
    setSaved({ at: null, failed: false });
  };

  /** The case exists: nothing more is kept on this device. */
  const markSent = () => {
    sent.current = true;
    clearTimeout(timer.current);
    clearDraft(userId);
  };

  return {
    form,
    step,
    setStep,
    household,
    setHouseholdList,
    setHouseholdExclusive,
    readings,
    addReading: (reading: HandReading) => setReadings((list) => [...list, reading]),
    removeReading: (index: number) => setReadings((list) => list.filter((_, k) => k !== index)),
    photos,
    setPhotos,
    logger,
    setLoggerFile: (file: File | null) => setLogger((l) => ({ ...l, file })),
    setLoggerRoom: (roomId: number | null) => setLogger((l) => ({ ...l, roomId })),
    restoredNote,
    savedAt: saved.at,
    saveFailed: saved.failed,
    restart,
    markSent,
  };
}

export type ReportDraftState = ReturnType<typeof useReportDraft>;
