import type { CaseDeadline } from "../api/types";

export interface NextDeadline {
  deadline: CaseDeadline;
  /** Due and not done: the time has passed. */
  overdue: boolean;
}

/**
 * The stage to watch: the earliest due date among the stages not done yet, overdue ones
 * included (an officer needs to see those first). null when no clock is running.
 */
export function nextDeadline(deadlines: readonly CaseDeadline[], now = Date.now()): NextDeadline | null {
  let next: CaseDeadline | null = null;
  for (const d of deadlines) {
    if (d.doneAt || !d.dueAt || d.state === "not-applicable" || d.state === "met") continue;
    if (!next || Date.parse(d.dueAt) < Date.parse(next.dueAt!)) next = d;
  }
  return next ? { deadline: next, overdue: Date.parse(next.dueAt!) < now } : null;
}
