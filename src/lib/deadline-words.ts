// How long until a deadline, or how long past it, in words a person reads at a glance.
// Whole units, rounded down: "Due in 1 day" for 47 hours, "Overdue by 3 hours" for 3 h 59 min.
import { plural } from "./labels";

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
