// Plain words for the values in the queue. Short forms: a table cell is narrow.
import { STATE_LABELS } from "@/components/risk/state-labels";
import type { QueueCategory, QueueRisk } from "./queue-view";

export const channelLabels: Record<string, string> = {
  "tenant-online": "Online (tenant)",
  phone: "Phone",
  letter: "Letter",
  email: "E-mail",
  visit: "Visit",
};

export const areaLabels: Record<string, string> = {
  hand: "Hand-sized or less",
  a4: "About A4",
  door: "About a door",
  larger: "Bigger than a door",
};

export const deadlineStageLabels: Record<string, string> = {
  "make-safe": "Make safe",
  investigate: "Investigate",
  summary: "Written summary",
  "safety-work": "Start safety work",
  "supplementary-work": "Start further work",
};

export const riskLabels: Record<QueueRisk, string> = {
  condensing: STATE_LABELS.condensing.label,
  "mould-risk": STATE_LABELS["mould-risk"].label,
  borderline: STATE_LABELS.borderline.label,
  dry: STATE_LABELS.dry.label,
  unknown: "No readings yet",
};

export const categoryLabels: Record<QueueCategory, string> = {
  "1": "Category 1",
  "2": "Category 2",
  none: "Not assessed",
};

/** The label for a value, or the value itself when we have no words for it yet. */
export const labelFor = (labels: Record<string, string>, value: string | null | undefined, missing = "—"): string =>
  value ? (labels[value] ?? value) : missing;

export const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
export const casesCount = (n: number) => plural(n, "case", "cases");
