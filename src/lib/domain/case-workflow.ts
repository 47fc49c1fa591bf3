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
  // Back to investigated when monitoring shows the fix did not work; back to triage when the tenant
  // says it has got worse while the fix is being checked (a reopening: it needs the tenant's words).
  monitoring: ["closed", "investigated", "triaged"],
  // Reopening: a closed or cancelled case goes back to triage.
  closed: ["triaged"],
  cancelled: ["triaged"],
};

/**
 * Moves that need a written reason whoever makes them: cancelling and reopening (a closed,
 * cancelled or monitored case going back to triage). A move made by hand always needs a reason
 * too (the case follows its work by itself, so a hand move is an exception): see
 * MANUAL_MOVES_NEED_A_REASON.
 */
export function transitionNeedsReason(from: CaseStatus, to: CaseStatus): boolean {
  return to === "cancelled" || from === "closed" || from === "cancelled" || (from === "monitoring" && to === "triaged");
}

/** Our own rule: a status changed by hand (not by the work itself) always says why. */
export const MANUAL_MOVES_NEED_A_REASON = true;

export function canTransition(from: CaseStatus, to: CaseStatus): boolean {
  return CASE_TRANSITIONS[from].includes(to);
}

/** The main path, in the order the work happens (the statuses but cancelled). */
export const MAIN_PATH: readonly CaseStatus[] = CASE_STATUSES.filter((s) => s !== "cancelled");

/**
 * The steps that take a case forward along the main path from `from` to `to`, each an allowed
 * move, the fewest possible (an optional step such as booking an inspection is skipped): e.g.
 * new → investigated is [triaged, investigated]. An empty list when the case is already there;
 * null when `to` is not ahead of `from` on the main path (behind it, or `from` is cancelled).
 * The case follows its work with these steps: an inspection recorded on a new case ends
 * investigated, each step written as its own status change.
 */
export function stepsForward(from: CaseStatus, to: CaseStatus): CaseStatus[] | null {
  if (from === to) return [];
  const start = MAIN_PATH.indexOf(from);
  const end = MAIN_PATH.indexOf(to);
  if (start < 0 || end < 0 || end < start) return null;
  // Breadth-first over forward moves only, so the path never goes back or sideways.
  const previous = new Map<CaseStatus, CaseStatus>();
  const queue: CaseStatus[] = [from];
  while (queue.length) {
    const at = queue.shift()!;
    if (at === to) break;
    for (const next of CASE_TRANSITIONS[at]) {
      const index = MAIN_PATH.indexOf(next);
      if (index <= MAIN_PATH.indexOf(at) || index > end || previous.has(next)) continue;
      previous.set(next, at);
      queue.push(next);
    }
  }
  if (!previous.has(to)) return null;
  const steps: CaseStatus[] = [];
  for (let at: CaseStatus = to; at !== from; at = previous.get(at)!) steps.unshift(at);
  return steps;
}

/** Statuses every one of `froms` can move to (what a change to several cases at once may offer). */
export function movesValidForAll(froms: readonly CaseStatus[]): CaseStatus[] {
  if (!froms.length) return [];
  return CASE_STATUSES.filter((to) => froms.every((from) => canTransition(from, to)));
}
