// The checks the works forms make before sending: the same rules as the server's schemas
// (server/modules/works/works.schemas.ts), with messages that say what to do.
import type { CompletionInput, WorkOrderInput, WorkOrderPriority, WorkOrderType } from "../api/case-types";
import { WORK_ORDER_TYPES } from "../api/case-types";
import { isIsoDate } from "./work-orders";

export interface NewOrderFields {
  type: WorkOrderType | "";
  description: string;
  roomIds: number[];
  priority: WorkOrderPriority | "";
  targetDate: string;
}

export type NewOrderErrors = Partial<Record<"type" | "description" | "priority" | "targetDate", string>>;

export const blankNewOrder = (): NewOrderFields => ({
  type: "",
  description: "",
  roomIds: [],
  priority: "routine",
  targetDate: "",
});

export function checkNewOrder(f: NewOrderFields): { input: WorkOrderInput | null; errors: NewOrderErrors } {
  const errors: NewOrderErrors = {};
  if (!f.type || !(WORK_ORDER_TYPES as readonly string[]).includes(f.type)) errors.type = "Choose the type of work.";
  const description = f.description.trim();
  if (description.length < 5) errors.description = "Describe the work in a few words (at least 5 characters).";
  else if (description.length > 4000) errors.description = "Keep the description under 4,000 characters.";
  const targetDate = f.targetDate.trim();
  if (targetDate && !isIsoDate(targetDate)) errors.targetDate = "Enter a real date, or leave it empty to use the deadline.";
  if (Object.keys(errors).length) return { input: null, errors };
  return {
    input: {
      type: f.type as WorkOrderType,
      description,
      ...(f.roomIds.length ? { roomIds: f.roomIds } : {}),
      ...(f.priority ? { priority: f.priority } : {}),
      ...(targetDate ? { targetDate } : {}),
    },
    errors,
  };
}

export interface CompletionFields {
  note: string;
  materials: string;
  minutesOnSite: string;
  followOn: string;
  /** The type of the order raised for the follow-on work ("" = other). */
  followOnType: WorkOrderType | "";
  /** The day the work was done, YYYY-MM-DD. */
  doneOn: string;
  earlyReason: string;
}

export type CompletionErrors = Partial<Record<keyof CompletionFields, string>>;

export const blankCompletion = (): CompletionFields => ({
  note: "",
  materials: "",
  minutesOnSite: "",
  followOn: "",
  followOnType: "",
  doneOn: "",
  earlyReason: "",
});

/** The work was done before the booked day: a reason is needed. */
export const doneEarly = (f: Pick<CompletionFields, "doneOn">, bookedOn: string | null) =>
  Boolean(bookedOn && isIsoDate(f.doneOn) && f.doneOn < bookedOn);

/**
 * The server's rules (server/modules/works/works.schemas.ts and WorkOrderService.complete) in words
 * that say what to do: the day the work was done (today or earlier), and why, when before the booked day.
 */
export function checkCompletion(
  f: CompletionFields,
  { today, bookedOn }: { today: string; bookedOn: string | null },
): { input: CompletionInput | null; errors: CompletionErrors } {
  const errors: CompletionErrors = {};
  const note = f.note.trim();
  if (note.length === 0) errors.note = "Say what was done: the tenant and the officer read it.";
  else if (note.length < 5) errors.note = "Say what was done in a sentence (at least 5 characters).";
  if (!f.doneOn) errors.doneOn = "Enter the day the work was done.";
  else if (!isIsoDate(f.doneOn)) errors.doneOn = "Enter a real date.";
  else if (f.doneOn > today)
    errors.doneOn = "The work cannot be recorded as done on a day still to come: enter today or an earlier day.";
  const early = doneEarly(f, bookedOn);
  const earlyReason = f.earlyReason.trim();
  if (early && earlyReason.length < 5)
    errors.earlyReason = "The work was done before the booked day: say why (at least 5 characters).";
  const minutesRaw = f.minutesOnSite.trim();
  let minutes: number | undefined;
  if (minutesRaw) {
    minutes = Number(minutesRaw);
    if (!/^\d+$/.test(minutesRaw) || !Number.isInteger(minutes) || minutes < 1 || minutes > 7200)
      errors.minutesOnSite = "Give the time on site as a whole number of minutes, for example 90.";
  }
  if (Object.keys(errors).length) return { input: null, errors };
  const materials = f.materials.trim();
  const followOn = f.followOn.trim();
  return {
    input: {
      note,
      doneOn: f.doneOn,
      ...(early ? { earlyReason } : {}),
      ...(materials ? { materials } : {}),
      ...(minutes !== undefined ? { minutesOnSite: minutes } : {}),
      ...(followOn ? { followOn, ...(f.followOnType ? { followOnType: f.followOnType } : {}) } : {}),
    },
    errors,
  };
}
