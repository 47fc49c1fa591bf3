// The compliance dashboard and "what works" (GET /api/insight/…): the shapes, and the columns of each
// of its tables as exported (CSV/.xlsx) and shown, with the same headings.
import { z } from "zod";
import { calendarDate, instant } from "./common.js";
import type { ExportColumn } from "./exports.js";
import { deadlineStageLabels, labelFor, riskLabels, staffStatusLabel, workTypeNames } from "../labels.js";
import { builtFormLabels, glazingTypeLabels, heatingTypeLabels, labelOf, wallTypeLabels } from "../homes.js";

export const INSIGHT_STAGES = ["make-safe", "investigate", "summary", "safety-work", "supplementary-work"] as const;
/** From awareness to: the investigation, the written summary, the works begun, the works completed. */
export const INSIGHT_DURATIONS = ["investigation", "summary", "works-begun", "works-completed"] as const;
export const HOTSPOT_DIMENSIONS = ["estate", "block", "builtForm", "wallType", "glazingType", "heatingType", "ageBand"] as const;
export type HotspotDimension = (typeof HOTSPOT_DIMENSIONS)[number];

const count = z.number().int().min(0);
const pct = z.number().min(0).max(100).nullable();
const keyCount = z.object({ key: z.string(), count });

export const stageRow = z.object({
  stage: z.enum(INSIGHT_STAGES),
  met: count,
  missed: count,
  open: count,
  metPct: pct,
  missedPct: pct,
});
export const stageMonthRow = stageRow.extend({ month: z.string() });
export const durationRow = z.object({
  to: z.enum(INSIGHT_DURATIONS),
  cases: count,
  medianWorkingDays: z.number().nullable(),
  p90WorkingDays: z.number().nullable(),
});
export const hotspotRow = z.object({
  dimension: z.enum(HOTSPOT_DIMENSIONS),
  value: z.string(),
  homes: count,
  cases: count,
  perHundredHomes: z.number().nullable(),
});
export const workloadRow = z.object({ id: z.number().int().positive(), name: z.string(), open: count, overdue: count });
export const monthCount = z.object({ month: z.string(), cases: count });
/** One complaint stage's clocks over the complaints raised in the period (complaints module). */
export const complaintStageRow = z.object({
  stage: z.union([z.literal(1), z.literal(2)]),
  reached: count,
  acknowledgedOnTime: count,
  acknowledgedLate: count,
  acknowledgeOverdue: count,
  respondedOnTime: count,
  respondedLate: count,
  respondOverdue: count,
  extensions: count,
});
export const complaintFigures = z.object({
  raised: count,
  open: count,
  closed: count,
  escalated: count,
  apologies: count,
  compensationOfferedPence: count,
  compensationPaidPence: count,
  stages: z.array(complaintStageRow),
});

export const dashboardResponse = z.object({
  from: calendarDate,
  to: calendarDate,
  estate: z.string().nullable(),
  estates: z.array(z.string()),
  generatedAt: instant,
  open: z.object({
    total: count,
    byStatus: z.array(keyCount),
    byRisk: z.array(keyCount),
    byCategory: z.array(keyCount),
  }),
  stages: z.array(stageRow),
  stagesByMonth: z.array(stageMonthRow),
  durations: z.array(durationRow),
  repeats: z.object({ cases: count, repeats: count, pct }),
  /** Sorted by cases per 100 homes, highest first, within each dimension. */
  hotspots: z.array(hotspotRow),
  seasonal: z.array(monthCount),
  officers: z.array(workloadRow),
  operatives: z.array(workloadRow),
  /** Formal complaints raised in the period (the whole landlord: complaints are not filtered by estate). */
  complaints: complaintFigures,
});
export type DashboardResponse = z.infer<typeof dashboardResponse>;

export const whatWorksRow = z.object({
  /** The kinds of work done in the round the verdict judged, sorted, joined with " + ". */
  workTypes: z.array(z.string()),
  builtForm: z.string(),
  wallType: z.string(),
  glazingType: z.string(),
  cases: z.number().int().min(5),
  effective: count,
  effectivePct: pct,
  /** Median change (after less before) of hours a day at ≥ 80 % surface RH; null when no verdict had readings. */
  medianHoursAt80PerDayChange: z.number().nullable(),
});
export const whatWorksResponse = z.object({
  from: calendarDate,
  to: calendarDate,
  estate: z.string().nullable(),
  minGroupSize: z.number().int(),
  groups: z.array(whatWorksRow),
  /** Groups under the minimum size, left out (their cases are not sent). */
  groupsNotShown: count,
});
export type WhatWorksResponse = z.infer<typeof whatWorksResponse>;

// ── The tables' words and their exports ─────────────────────────────────────────────────────────

export const INSIGHT_TABLES = [
  "open-status",
  "open-risk",
  "open-category",
  "stages",
  "stages-by-month",
  "durations",
  "hotspots",
  "seasonal",
  "officers",
  "operatives",
  "complaints",
  "what-works",
] as const;
export type InsightTable = (typeof INSIGHT_TABLES)[number];

export const durationLabels: Record<(typeof INSIGHT_DURATIONS)[number], string> = {
  investigation: "Awareness to investigation",
  summary: "Awareness to written summary",
  "works-begun": "Awareness to works begun",
  "works-completed": "Awareness to works completed",
};

export const hotspotDimensionLabels: Record<HotspotDimension, string> = {
  estate: "Estate",
  block: "Block",
  builtForm: "Built form",
  wallType: "Walls",
  glazingType: "Glazing",
  heatingType: "Heating",
  ageBand: "Age band",
};

export const categoryLabel = (key: string) => (key === "1" || key === "2" ? `Category ${key}` : "Not assessed");
export const riskLabel = (key: string) => labelFor(riskLabels, key, riskLabels.unknown);
export const stageLabel = (stage: string) => labelFor(deadlineStageLabels, stage);
export const hotspotValueLabel = (dimension: HotspotDimension, value: string): string => {
  if (value === "") return "Not recorded";
  if (dimension === "builtForm") return labelOf(builtFormLabels, value);
  if (dimension === "wallType") return labelOf(wallTypeLabels, value);
  if (dimension === "glazingType") return labelOf(glazingTypeLabels, value);
  if (dimension === "heatingType") return labelOf(heatingTypeLabels, value);
  return value;
};
export const workTypesLabel = (types: readonly string[]) =>
  types.length ? types.map((t) => labelFor(workTypeNames, t)).join(" + ") : "No work recorded";

type KeyCount = z.infer<typeof keyCount>;
type StageRow = z.infer<typeof stageRow>;
type StageMonthRow = z.infer<typeof stageMonthRow>;
type DurationRow = z.infer<typeof durationRow>;
type HotspotRow = z.infer<typeof hotspotRow>;
type WorkloadRow = z.infer<typeof workloadRow>;
type MonthCount = z.infer<typeof monthCount>;
type ComplaintStageRow = z.infer<typeof complaintStageRow>;
type WhatWorksRow = z.infer<typeof whatWorksRow>;

const stageColumns = <T extends StageRow>(): ExportColumn<T>[] => [
  { id: "stage", header: "Stage", value: (r) => stageLabel(r.stage) },
  { id: "met", header: "Met", value: (r) => r.met },
  { id: "missed", header: "Missed", value: (r) => r.missed },
  { id: "open", header: "Open", value: (r) => r.open },
  { id: "metPct", header: "Met %", value: (r) => r.metPct },
  { id: "missedPct", header: "Missed %", value: (r) => r.missedPct },
];
const workloadColumns = (who: string): ExportColumn<WorkloadRow>[] => [
  { id: "name", header: who, value: (r) => r.name },
  { id: "open", header: "Open", value: (r) => r.open },
  { id: "overdue", header: "Overdue", value: (r) => r.overdue },
];

/** Each table's columns: its headings on screen and in the file. */
export const INSIGHT_COLUMNS = {
  "open-status": [
    { id: "key", header: "Status", value: (r) => staffStatusLabel(r.key) },
    { id: "count", header: "Open cases", value: (r) => r.count },
  ] as ExportColumn<KeyCount>[],
  "open-risk": [
    { id: "key", header: "Risk state", value: (r) => riskLabel(r.key) },
    { id: "count", header: "Open cases", value: (r) => r.count },
  ] as ExportColumn<KeyCount>[],
  "open-category": [
    { id: "key", header: "HHSRS category", value: (r) => categoryLabel(r.key) },
    { id: "count", header: "Open cases", value: (r) => r.count },
  ] as ExportColumn<KeyCount>[],
  stages: stageColumns<StageRow>(),
  "stages-by-month": [
    { id: "month", header: "Month reported", value: (r) => r.month },
    ...stageColumns<StageMonthRow>(),
  ] as ExportColumn<StageMonthRow>[],
  durations: [
    { id: "to", header: "From awareness to", value: (r) => durationLabels[r.to] },
    { id: "cases", header: "Cases", value: (r) => r.cases },
    { id: "median", header: "Median working days", value: (r) => r.medianWorkingDays },
    { id: "p90", header: "90th percentile working days", value: (r) => r.p90WorkingDays },
  ] as ExportColumn<DurationRow>[],
  hotspots: [
    { id: "dimension", header: "By", value: (r) => hotspotDimensionLabels[r.dimension] },
    { id: "value", header: "Group", value: (r) => hotspotValueLabel(r.dimension, r.value) },
    { id: "homes", header: "Homes", value: (r) => r.homes },
    { id: "cases", header: "Cases", value: (r) => r.cases },
    { id: "perHundred", header: "Cases per 100 homes", value: (r) => r.perHundredHomes },
  ] as ExportColumn<HotspotRow>[],
  seasonal: [
    { id: "month", header: "Month reported", value: (r) => r.month },
    { id: "cases", header: "Cases", value: (r) => r.cases },
  ] as ExportColumn<MonthCount>[],
  officers: workloadColumns("Officer"),
  operatives: workloadColumns("Operative"),
  complaints: [
    { id: "stage", header: "Complaint stage", value: (r) => r.stage },
    { id: "reached", header: "Complaints", value: (r) => r.reached },
    { id: "ackOnTime", header: "Acknowledged on time", value: (r) => r.acknowledgedOnTime },
    { id: "ackLate", header: "Acknowledged late", value: (r) => r.acknowledgedLate },
    { id: "ackOverdue", header: "Acknowledgement overdue", value: (r) => r.acknowledgeOverdue },
    { id: "respOnTime", header: "Responded on time", value: (r) => r.respondedOnTime },
    { id: "respLate", header: "Responded late", value: (r) => r.respondedLate },
    { id: "respOverdue", header: "Response overdue", value: (r) => r.respondOverdue },
    { id: "extensions", header: "Extended", value: (r) => r.extensions },
  ] as ExportColumn<ComplaintStageRow>[],
  "what-works": [
    { id: "workTypes", header: "Work done", value: (r) => workTypesLabel(r.workTypes) },
    { id: "builtForm", header: "Built form", value: (r) => labelOf(builtFormLabels, r.builtForm) },
    { id: "wallType", header: "Walls", value: (r) => labelOf(wallTypeLabels, r.wallType) },
    { id: "glazingType", header: "Glazing", value: (r) => labelOf(glazingTypeLabels, r.glazingType) },
    { id: "cases", header: "Fixes judged", value: (r) => r.cases },
    { id: "effective", header: "Judged effective", value: (r) => r.effective },
    { id: "effectivePct", header: "Effective %", value: (r) => r.effectivePct },
    {
      id: "change",
      header: "Median change in hours a day at ≥ 80 % surface RH",
      value: (r) => r.medianHoursAt80PerDayChange,
    },
  ] as ExportColumn<WhatWorksRow>[],
} satisfies Record<InsightTable, ExportColumn<never>[]>;
