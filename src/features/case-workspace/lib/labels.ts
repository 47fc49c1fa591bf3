// Plain words for what officers record and read in the workspace. The stored values are the
// server's (server/modules/inspections/inspection.entity.ts, src/lib/domain/deadlines.ts,
// src/lib/domain/triage-priority.ts); these are what people read.
import type { Cause, DeadlineStage, DeadlineState, HazardClass, MouldExtent } from "../api/types";

export interface Choice<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

export const HAZARD_CLASS_CHOICES: readonly Choice<HazardClass>[] = [
  {
    value: "emergency",
    label: "Emergency hazard",
    hint: "An immediate risk to health or safety: make safe and investigate within the emergency timeframe.",
  },
  {
    value: "significant",
    label: "Significant hazard",
    hint: "A real risk to health: investigate, send the written summary and start the work within the timeframes.",
  },
  {
    value: "not-significant",
    label: "Not a significant hazard",
    hint: "No statutory timeframe applies. The report is still looked into and answered.",
  },
];

export function hazardClassLabel(value: string | null | undefined): string {
  if (!value) return "Not classified yet";
  return HAZARD_CLASS_CHOICES.find((c) => c.value === value)?.label ?? value;
}

export const CAUSE_CHOICES: readonly Choice<Cause>[] = [
  {
    value: "condensation",
    label: "Condensation",
    hint: "Moisture in the indoor air settling on surfaces colder than its dew point.",
  },
  { value: "penetrating-damp", label: "Penetrating damp", hint: "Water coming through a wall, window or door from outside." },
  { value: "rising-damp", label: "Rising damp", hint: "Ground moisture rising through a wall or floor." },
  { value: "plumbing-leak", label: "Plumbing leak", hint: "Water escaping from pipes, fittings, appliances or waste." },
  { value: "roof-gutter", label: "Roof or gutter", hint: "Water getting in from the roof, a gutter or a downpipe." },
  { value: "other-unknown", label: "Other or not yet known", hint: "Say in the findings what else is needed to find the cause." },
];

export const MOULD_EXTENT_CHOICES: readonly Choice<MouldExtent>[] = [
  { value: "none", label: "No visible mould" },
  { value: "under-1-m2", label: "Less than 1 m²" },
  { value: "1-to-5-m2", label: "1 to 5 m²" },
  { value: "over-5-m2", label: "More than 5 m²" },
];

export const labelOf = <V extends string>(choices: readonly Choice<V>[], value: string): string =>
  choices.find((c) => c.value === value)?.label ?? value;

/** Each deadline stage in plain words. */
export const STAGE_LABELS: Record<DeadlineStage, string> = {
  "make-safe": "Make safe",
  investigate: "Investigate",
  summary: "Written summary",
  "safety-work": "Safety work begun",
  "supplementary-work": "Supplementary work begun",
};

export const stageLabel = (stage: string): string => (STAGE_LABELS as Record<string, string>)[stage] ?? stage;

export const STATE_LABELS: Record<DeadlineState, string> = {
  pending: "Pending",
  met: "Met",
  missed: "Missed",
  "not-applicable": "Not applicable",
};

export const stateLabel = (state: string): string => (STATE_LABELS as Record<string, string>)[state] ?? state;

/** The triage factors (src/lib/domain/triage-priority.ts TRIAGE_FACTORS). */
export const TRIAGE_FACTOR_LABELS: Record<string, string> = {
  "surface-state": "Surface condition from the readings",
  "mould-index": "Mould growth index",
  "affected-area": "Area affected",
  vulnerability: "Vulnerable household",
  hhsrs: "HHSRS assessment",
  recurrence: "Earlier report at this home",
  deadline: "Time to the next deadline",
  "reported-worse": "Tenant says it got worse",
  "emergency-overdue": "Emergency past its deadline",
};

export const triageFactorLabel = (factor: string): string => TRIAGE_FACTOR_LABELS[factor] ?? factor;

/** What the readings over time point to (the engine's diagnosis kinds), for staff. */
export const DIAGNOSIS_HINTS: Record<string, string> = {
  "ventilation-or-moisture-load": "More moisture in the air than the ventilation removes",
  "cold-surface": "A surface runs colder than a sound one should (check insulation and thermal bridges)",
  "likely-not-condensation": "Probably not condensation: look for water getting in (leak, penetrating or rising damp)",
  "no-risk-found": "No condensation or mould-growth conditions in these readings",
  "insufficient-data": "Not enough readings to see a pattern",
};

export const MOISTURE_UNITS = [
  { value: "pct", label: "%" },
  { value: "wme", label: "WME" },
] as const;
