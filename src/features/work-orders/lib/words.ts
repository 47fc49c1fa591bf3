// Plain words for work orders. The stored values are the server's (server/modules/works/
// work-order.entity.ts); these are what staff and tenants read.
import { formatCalendarLong, todayInLondon } from "@/lib/dates";
import { priorityLabels, type WorkOrderPriority, type WorkOrderType } from "./work-orders";

export interface Choice<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

interface TypeWords {
  /** What staff read in lists and the type select. */
  label: string;
  /** What the tenant reads: "We will …". */
  tenant: string;
}

export const WORK_TYPE_WORDS: Record<WorkOrderType, TypeWords> = {
  "extractor-fan": { label: "Extractor fan: fit or repair", tenant: "fit or repair an extractor fan" },
  "fan-upgrade": { label: "Extractor fan: replace with a stronger one", tenant: "replace the extractor fan with a stronger one" },
  "trickle-vents": {
    label: "Trickle vents in the windows",
    tenant: "fit or repair the small vents in the window frames (trickle vents)",
  },
  "door-undercut": {
    label: "Door undercut (a gap under the door for air)",
    tenant: "trim the bottom of a door so air can move between rooms",
  },
  "piv-unit": {
    label: "Positive input ventilation unit",
    tenant: "fit a unit that gently blows fresh, filtered air into the home",
  },
  "mould-wash": { label: "Mould wash and treatment", tenant: "clean and treat the mould" },
  "mould-resistant-decoration": {
    label: "Redecorate with mould-resistant paint",
    tenant: "redecorate with mould-resistant paint",
  },
  insulation: { label: "Insulation", tenant: "add or repair insulation" },
  "draught-proofing": { label: "Draught-proofing", tenant: "seal draughts around windows and doors" },
  heating: { label: "Heating repair or improvement", tenant: "repair or improve the heating" },
  "leak-repair": { label: "Leak repair", tenant: "repair a leak" },
  "roof-gutter": { label: "Roof or gutter repair", tenant: "repair the roof or gutters" },
  "damp-proofing": { label: "Damp-proofing", tenant: "treat damp coming through the walls or floor" },
  other: { label: "Other work", tenant: "carry out repair work" },
};

const isType = (t: string): t is WorkOrderType => Object.hasOwn(WORK_TYPE_WORDS, t);

export const workTypeLabel = (type: string): string => (isType(type) ? WORK_TYPE_WORDS[type].label : type);
export const workTypeForTenant = (type: string): string =>
  isType(type) ? WORK_TYPE_WORDS[type].tenant : "carry out repair work";

/** Work that involves the home's electrics or gas: the tenant is told the power may go off for a while. */
const SERVICE_TYPES: readonly string[] = ["extractor-fan", "fan-upgrade", "piv-unit", "heating"];
export const touchesServices = (type: string) => SERVICE_TYPES.includes(type);

export const PRIORITY_CHOICES: readonly Choice<WorkOrderPriority>[] = [
  { value: "emergency", label: priorityLabels.emergency, hint: "A danger to health or safety now." },
  { value: "urgent", label: priorityLabels.urgent, hint: "Needs doing within days." },
  { value: "routine", label: priorityLabels.routine, hint: "Planned work by the target date." },
];
export const priorityLabel = (p: string) => PRIORITY_CHOICES.find((c) => c.value === p)?.label ?? p;

const STATUS_WORDS: Record<string, string> = {
  unscheduled: "Not booked yet",
  scheduled: "Appointment offered to the tenant",
  confirmed: "Appointment confirmed by the tenant",
  "change-requested": "Tenant asked for another time",
  done: "Done",
  cancelled: "Cancelled",
};
export const workStatusLabel = (status: string) => STATUS_WORDS[status] ?? status;

const STAFF_WINDOW: Record<string, string> = { am: "morning 8am–12", pm: "afternoon 12–5pm", "all-day": "all day 8am–5pm" };
const TENANT_WINDOW: Record<string, string> = {
  am: "in the morning (8am to 12 noon)",
  pm: "in the afternoon (12 noon to 5pm)",
  "all-day": "at some time during the day (8am to 5pm)",
};

/** "Tuesday 8 December 2026" from "2026-12-08" (the calendar date as it is, never shifted a day). */
export const longDate = (date: string) => formatCalendarLong(date);

/** "Tuesday 8 December 2026, morning 8am–12". */
export const slotForStaff = (slot: { date: string; window: string }) =>
  `${longDate(slot.date)}, ${STAFF_WINDOW[slot.window] ?? slot.window}`;

/** "Tuesday 8 December, in the morning (8am to 12 noon)". The year is said only when it is not this year. */
export function slotForTenant(slot: { date: string; window: string }, now: Date = new Date()): string {
  const thisYear = slot.date.slice(0, 4) === todayInLondon(now).slice(0, 4);
  return `${formatCalendarLong(slot.date, !thisYear)}, ${TENANT_WINDOW[slot.window] ?? slot.window}`;
}

/** "1 hour 30 minutes" from 90. */
export function minutesInWords(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  const hours = h ? `${h} ${h === 1 ? "hour" : "hours"}` : "";
  const mins = m ? `${m} ${m === 1 ? "minute" : "minutes"}` : "";
  return [hours, mins].filter(Boolean).join(" ") || "0 minutes";
}
