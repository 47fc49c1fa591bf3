// Which status a case may move to from where it is. The order of the main path is the work itself:
// a report is triaged, inspected, its works planned and done, the home monitored, then the case closed.
// The side moves (back a step, cancel, reopen) are our own choice of what real work needs.
export const CASE_STATUSES = [
  "new",
  "triaged",
  "inspection-booked",
  "investigated",
  "works-planned",
  "works-done",
  "monitoring",
  "closed",
  "cancelled",
] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];
/** Every status but the two ends (closed, cancelled). */
export const OPEN_CASE_STATUSES: readonly CaseStatus[] = CASE_STATUSES.filter((s) => s !== "closed" && s !== "cancelled");

export const CASE_TRANSITIONS: Readonly<Record<CaseStatus, readonly CaseStatus[]>> = {
  new: ["triaged", "cancelled"],
  // An inspection can be recorded without booking it first (the officer was already on site).
  triaged: ["inspection-booked", "investigated", "cancelled"],
  // Back to triaged when the booking falls through.
  "inspection-booked": ["investigated", "triaged", "cancelled"],
  // Closed straight from investigated when no works are needed.
  investigated: ["works-planned", "closed", "cancelled"],
  // Back to investigated when the planned works turn out to be the wrong ones.
  "works-planned": ["works-done", "investigated", "cancelled"],
  "works-done": ["monitoring", "closed"],
  // Back to investigated when monitoring shows the fix did not work.
  monitoring: ["closed", "investigated"],
  // Reopening: a closed or cancelled case goes back to triage.
  closed: ["triaged"],
  cancelled: ["triaged"],
};

/** Moves that need a written reason: cancelling and reopening. */
export function transitionNeedsReason(from: CaseStatus, to: CaseStatus): boolean {
  return to === "cancelled" || from === "closed" || from === "cancelled";
}

export function canTransition(from: CaseStatus, to: CaseStatus): boolean {
  return CASE_TRANSITIONS[from].includes(to);
}
