// A report in progress, kept in this browser's localStorage so a dropped connection or a closed
// tab loses nothing. Photos and files cannot be stored there; only how many there were.
import type { z } from "zod";
import {
  AREAS,
  DURATIONS,
  EQUIPMENT_ANSWERS,
  HEATING_COST_ANSWERS,
  LOCATIONS,
  OBSERVATIONS,
  VULNERABILITIES,
  type caseReportSchema,
} from "@/lib/schemas/case-report";
import type { HandReading } from "../api/types";

export type ReportFormValues = z.input<typeof caseReportSchema>;

/** "list": some boxes ticked; "none": none of these (an empty list); "prefer-not": no answer given on purpose. */
export type HouseholdAnswer = "list" | "none" | "prefer-not" | null;

export interface ReportDraft {
  version: 1;
  savedAt: string;
  step: number;
  values: ReportFormValues;
  household: HouseholdAnswer;
  readings: HandReading[];
  /** Photos chosen when the draft was saved; they have to be chosen again. */
  photoCount: number;
  hadLoggerFile: boolean;
}

export const emptyReport = (): ReportFormValues => ({
  description: "",
  locations: [],
  observations: [],
  roomIds: [],
  since: undefined,
  area: undefined,
  vulnerability: undefined,
  equipment: {},
});

export const draftKey = (userId: number) => `dewline:report-draft:${userId}`;

const oneOf = <T extends string>(values: readonly T[], v: unknown): T | undefined =>
  typeof v === "string" && (values as readonly string[]).includes(v) ? (v as T) : undefined;
const listOf = <T extends string>(values: readonly T[], v: unknown): T[] =>
  Array.isArray(v) ? [...new Set(v.filter((x): x is T => oneOf(values, x) !== undefined))] : [];
const finite = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

function readingFrom(v: unknown): HandReading | null {
  if (typeof v !== "object" || v === null) return null;
  const r = v as Record<string, unknown>;
  if (!finite(r.roomId) || typeof r.takenAt !== "string" || !finite(r.airTemperatureC) || !finite(r.relativeHumidityPct))
    return null;
  const out: HandReading = {
    roomId: r.roomId,
    takenAt: r.takenAt,
    airTemperatureC: r.airTemperatureC,
    relativeHumidityPct: r.relativeHumidityPct,
  };
  if (finite(r.surfaceTemperatureC)) out.surfaceTemperatureC = r.surfaceTemperatureC;
  if (finite(r.outdoorTemperatureC)) out.outdoorTemperatureC = r.outdoorTemperatureC;
  return out;
}

/** Whatever is stored, only known values come back: an old or edited draft never breaks the form. */
export function parseDraft(raw: string | null): ReportDraft | null {
  if (!raw) return null;
  let data: unknown;
  try {
    data = JSON.parse(raw);
  } catch {
    return null;
  }
  if (typeof data !== "object" || data === null || (data as { version?: unknown }).version !== 1) return null;
  const d = data as Record<string, unknown>;
  const v = (typeof d.values === "object" && d.values !== null ? d.values : {}) as Record<string, unknown>;
  const eq = (typeof v.equipment === "object" && v.equipment !== null ? v.equipment : {}) as Record<string, unknown>;
  const household = d.household === "list" || d.household === "none" || d.household === "prefer-not" ? d.household : null;
  const vulnerability = listOf(VULNERABILITIES, v.vulnerability);
  const values: ReportFormValues = {
    description: typeof v.description === "string" ? v.description : "",
    locations: listOf(LOCATIONS, v.locations),
    observations: listOf(OBSERVATIONS, v.observations),
    roomIds: Array.isArray(v.roomIds) ? v.roomIds.filter((x): x is number => Number.isInteger(x) && x > 0) : [],
    since: oneOf(DURATIONS, v.since),
    area: oneOf(AREAS, v.area),
    vulnerability: household === "none" ? [] : household === "list" && vulnerability.length ? vulnerability : undefined,
    equipment: {
      heatingUsable: oneOf(EQUIPMENT_ANSWERS, eq.heatingUsable),
      extractorFanWorks: oneOf(EQUIPMENT_ANSWERS, eq.extractorFanWorks),
      trickleVentsOpen: oneOf(EQUIPMENT_ANSWERS, eq.trickleVentsOpen),
      heatingCost: oneOf(HEATING_COST_ANSWERS, eq.heatingCost),
    },
  };
  return {
    version: 1,
    savedAt: typeof d.savedAt === "string" ? d.savedAt : new Date().toISOString(),
    step: Number.isInteger(d.step) ? Math.max(0, Math.min(5, d.step as number)) : 0,
    values,
    household: household === "list" && !values.vulnerability ? null : household,
    readings: Array.isArray(d.readings) ? d.readings.map(readingFrom).filter((r): r is HandReading => r !== null) : [],
    photoCount: finite(d.photoCount) ? d.photoCount : 0,
    hadLoggerFile: d.hadLoggerFile === true,
  };
}

/** Nothing typed or chosen yet: not worth keeping or offering back. */
export function isBlank(draft: Pick<ReportDraft, "values" | "readings" | "household">): boolean {
  const v = draft.values;
  const eq = v.equipment ?? {};
  return (
    !v.description?.trim() &&
    !v.locations?.length &&
    !v.observations?.length &&
    !v.roomIds?.length &&
    !v.since &&
    !v.area &&
    draft.household === null &&
    !eq.heatingUsable &&
    !eq.extractorFanWorks &&
    !eq.trickleVentsOpen &&
    draft.readings.length === 0
  );
}

// localStorage can be missing or full (private browsing): a draft is a kindness, never a failure.
export function loadDraft(userId: number): ReportDraft | null {
  try {
    return parseDraft(window.localStorage.getItem(draftKey(userId)));
  } catch {
    return null;
  }
}

export function saveDraft(userId: number, draft: ReportDraft): boolean {
  try {
    window.localStorage.setItem(draftKey(userId), JSON.stringify(draft));
    return true;
  } catch {
    return false;
  }
}

export function clearDraft(userId: number): void {
  try {
    window.localStorage.removeItem(draftKey(userId));
  } catch {
    // Nothing to clear.
  }
}
