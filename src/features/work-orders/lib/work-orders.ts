// What the /works page and the case's works sections share about work orders: the API's value lists
// (src/lib/schemas/work-orders.ts, shared with the server), their names and the PATCH that books a visit. No React here.
import { api } from "@/lib/api-client";
import type { SlotWindow, WorkOrderPriority, WorkOrderType } from "@/lib/schemas/work-orders";

export { SLOT_WINDOWS, WORK_ORDER_PRIORITIES, WORK_ORDER_STATUSES, WORK_ORDER_TYPES } from "@/lib/schemas/work-orders";
export type { BookingResponse, SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "@/lib/schemas/work-orders";

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

/** The windows' names and their London hours. */
export const windowNames: Record<SlotWindow, string> = { am: "Morning", pm: "Afternoon", "all-day": "All day" };
export const windowHours: Record<SlotWindow, string> = { am: "8am to 12 noon", pm: "12 noon to 5pm", "all-day": "8am to 5pm" };

export { isIsoDate, todayInLondon } from "@/lib/dates";

/** PATCH /api/work-orders/:id to book (or rebook) an operative or a contractor. */
export type ScheduleBody =
  | { assigneeId: number; slot: { date: string; window: SlotWindow } }
  | { contractorId: number; slot: { date: string; window: SlotWindow } };

/**
 * PATCH /api/work-orders/:id: schedule or reschedule (409 `double_booked` when the operative already
 * has that half-day), complete or cancel. Each screen says which order shape it reads back.
 */
export const patchWorkOrder = <TOrder>(id: number, body: object) => api.patch<TOrder>(`/work-orders/${id}`, body);
