// The queue's "Next deadline" in words, one formatter for the screen and the export: how long until
// the deadline or how long past it, the stage, and its London day and time ("Due in 3 days: Make safe,
// 3 Mar, 23:59 GMT"). Whole units, rounded down: "Due in 1 day" for 47 hours, "Overdue by 3 hours"
// for 3 h 59 min.
import { formatDayTimeZoned } from "./dates.js";
import { deadlineStageLabels, labelFor, plural } from "./labels.js";

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

export interface TimeLeft {
  overdue: boolean;
  /** Less than a day to go. */
  soon: boolean;
  text: string;
}

function span(ms: number): string {
  if (ms >= DAY) return plural(Math.floor(ms / DAY), "day", "days");
  if (ms >= HOUR) return plural(Math.floor(ms / HOUR), "hour", "hours");
  return plural(Math.max(1, Math.floor(ms / MINUTE)), "minute", "minutes");
}

/**
 * `overdue` is the server's verdict; it wins over the two clocks, so a case the server calls
 * overdue never reads "Due in …" because this computer's clock is a little behind.
 */
export function timeLeft(dueAt: string, now: number, overdue = false): TimeLeft {
  const diff = new Date(dueAt).getTime() - now;
  if (Number.isNaN(diff)) return { overdue, soon: false, text: overdue ? "Overdue" : "" };
  if (diff < 0 || overdue) return { overdue: true, soon: false, text: diff < 0 ? `Overdue by ${span(-diff)}` : "Overdue" };
  return { overdue: false, soon: diff < DAY, text: `Due in ${span(diff)}` };
}

/** What the queue says when a case has no deadline running. */
export const NO_DEADLINE_RUNNING = "No deadline running";

export interface NextDeadlineWords {
  left: TimeLeft;
  /** "Start safety work". */
  stage: string;
  /** "3 Mar, 23:59 GMT". */
  due: string;
}

/** The parts the queue's "Next deadline" cell shows. */
export function nextDeadlineWords(next: { stage: string; dueAt: string }, overdue: boolean, now: number): NextDeadlineWords {
  return {
    left: timeLeft(next.dueAt, now, overdue),
    stage: labelFor(deadlineStageLabels, next.stage),
    due: formatDayTimeZoned(next.dueAt),
  };
}

/** The cell as one line of text, for an export: "Overdue by 2 days: Start safety work, 3 Mar, 23:59 GMT". */
export function nextDeadlineText(next: { stage: string; dueAt: string } | null, overdue: boolean, now: number): string {
  if (!next) return NO_DEADLINE_RUNNING;
  const { left, stage, due } = nextDeadlineWords(next, overdue, now);
  return `${left.text ? `${left.text}: ` : ""}${stage}, ${due}`;
}
