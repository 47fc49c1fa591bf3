// Plain words for the stored codes the tables show: one map per vocabulary, read by the client's
// screens and by the server's exports, so a file says what the screen says. (Homes' words are in
// homes.ts, roles' in roles.ts, the surface states' in surface-state-labels.ts.)
import type { UserStatus } from "./contracts/users.js";
import type { CaseStatus } from "./domain/case-workflow.js";
import type { SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "./schemas/work-orders.js";
import type { SurfaceState } from "./domain/surface.js";
import { STATE_LABELS } from "./surface-state-labels.js";

/** The label for a value, or the value itself when we have no words for it yet. */
export const labelFor = (labels: Record<string, string>, value: string | null | undefined, missing = "—"): string =>
  value ? (labels[value] ?? value) : missing;

/** "1 day", "3 days". */
export const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "works-planned" → "Works planned": something readable for a value we have no words for yet. */
export function humanise(value: string): string {
  const words = value.replace(/[-_]+/g, " ").trim();
  return words ? words.charAt(0).toUpperCase() + words.slice(1) : value;
}

// ── Cases ────────────────────────────────────────────────────────────────────────────────────────

/** The workflow's own names, for staff: the stages they move a case through. */
export const staffStatusLabels: Record<CaseStatus, string> = {
  new: "New",
  triaged: "Triaged",
  "inspection-booked": "Inspection booked",
  investigated: "Investigated",
  "works-planned": "Works planned",
  "works-done": "Works done",
  monitoring: "Monitoring",
  closed: "Closed",
  cancelled: "Cancelled",
};

/** A case's status as staff read it. */
export const staffStatusLabel = (status: string): string =>
  (staffStatusLabels as Record<string, string>)[status] ?? humanise(status);

/** Where a reading came from. */
export const sourceLabels: Record<string, string> = {
  manual: "By hand",
  import: "Logger file",
};

// ── The officers' queue (short forms: a table cell is narrow) ───────────────────────────────────

export const channelLabels: Record<string, string> = {
  "tenant-online": "Online (tenant)",
  phone: "Phone",
  letter: "Letter",
  email: "E-mail",
  visit: "Visit",
  sensor: "Sensor alert",
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

/** The queue's risk column and filter: the worst surface state, or no readings at all. */
export const riskLabels: Record<SurfaceState | "unknown", string> = {
  condensing: STATE_LABELS.condensing.label,
  "mould-risk": STATE_LABELS["mould-risk"].label,
  borderline: STATE_LABELS.borderline.label,
  dry: STATE_LABELS.dry.label,
  unknown: "No readings yet",
};

// ── Work orders ──────────────────────────────────────────────────────────────────────────────────

/** The types' short names, the same on every screen that names an order in a word or two. */
export const workTypeNames: Record<WorkOrderType, string> = {
  "extractor-fan": "Extractor fan",
  "fan-upgrade": "Fan upgrade",
  "trickle-vents": "Trickle vents",
  "door-undercut": "Door undercut",
  "piv-unit": "Positive input ventilation unit",
  "mould-wash": "Mould wash",
  "mould-resistant-decoration": "Mould-resistant decoration",
  insulation: "Insulation",
  "draught-proofing": "Draught-proofing",
  heating: "Heating",
  "leak-repair": "Leak repair",
  "roof-gutter": "Roof or gutter repair",
  "damp-proofing": "Damp-proofing",
  other: "Other work",
};

/** Priorities in words, the same on every screen. */
export const priorityLabels: Record<WorkOrderPriority, string> = {
  emergency: "Emergency",
  urgent: "Urgent",
  routine: "Routine",
};

export const workOrderStatusLabels: Record<WorkOrderStatus, string> = {
  unscheduled: "To schedule",
  scheduled: "Slot offered",
  "change-requested": "Tenant wants another slot",
  confirmed: "Slot confirmed",
  done: "Done",
  cancelled: "Cancelled",
};

export const windowShortLabels: Record<SlotWindow, string> = {
  am: "Morning 8–12",
  pm: "Afternoon 12–5",
  "all-day": "All day 8–5",
};

// ── Accounts ─────────────────────────────────────────────────────────────────────────────────────

export const userStatusLabels: Record<UserStatus, string> = {
  invited: "Invited",
  active: "Active",
  disabled: "Disabled",
  cancelled: "Invitation cancelled",
};
