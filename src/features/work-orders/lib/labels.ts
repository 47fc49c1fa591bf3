// Plain words for the values of a work order.
import { windowHours, windowNames } from "./work-orders";
import type { BookingResponse, SlotWindow } from "../api/types";

export { workTypeNames as typeLabels } from "./work-orders";

export { priorityLabels } from "./work-orders";

export { workOrderStatusLabels as statusLabels, windowShortLabels } from "@/lib/labels";

export const windowLabels: Record<SlotWindow, string> = {
  am: `${windowNames.am}, ${windowHours.am}`,
  pm: `${windowNames.pm}, ${windowHours.pm}`,
  "all-day": `${windowNames["all-day"]}, ${windowHours["all-day"]}`,
};

/** The tenant's answer to the booking, in words. */
export type TenantAnswer = "awaiting" | BookingResponse;
export const answerLabels: Record<TenantAnswer, string> = {
  awaiting: "Awaiting reply",
  confirmed: "Confirmed",
  "change-requested": "Asked for another slot",
};

export { labelFor } from "@/lib/labels";

export const orderReference = (order: { caseReference: string | null; caseId: number }) =>
  order.caseReference ?? `Case ${order.caseId}`;
