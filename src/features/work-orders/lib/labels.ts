// Plain words for the values of a work order.
import { windowHours, windowNames } from "./work-orders";
import type { BookingResponse, SlotWindow, WorkOrderStatus } from "../api/types";

export { workTypeNames as typeLabels } from "./work-orders";

export { priorityLabels } from "./work-orders";

export const statusLabels: Record<WorkOrderStatus, string> = {
  unscheduled: "To schedule",
  scheduled: "Slot offered",
  "change-requested": "Tenant wants another slot",
  confirmed: "Slot confirmed",
  done: "Done",
  cancelled: "Cancelled",
};

export const windowLabels: Record<SlotWindow, string> = {
  am: `${windowNames.am}, ${windowHours.am}`,
  pm: `${windowNames.pm}, ${windowHours.pm}`,
  "all-day": `${windowNames["all-day"]}, ${windowHours["all-day"]}`,
};

export const windowShortLabels: Record<SlotWindow, string> = {
  am: "Morning 8–12",
  pm: "Afternoon 12–5",
  "all-day": "All day 8–5",
};

/** The tenant's answer to the booking, in words. */
export type TenantAnswer = "awaiting" | BookingResponse;
export const answerLabels: Record<TenantAnswer, string> = {
  awaiting: "Awaiting reply",
  confirmed: "Confirmed",
  "change-requested": "Asked for another slot",
};

export const labelFor = (labels: Record<string, string>, value: string | null | undefined, missing = "—"): string =>
  value ? (labels[value] ?? value) : missing;

export const orderReference = (order: { caseReference: string | null; caseId: number }) =>
  order.caseReference ?? `Case ${order.caseId}`;
