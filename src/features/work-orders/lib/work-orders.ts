// What the /works page and the case's works sections share about work orders: the API's value lists
// (src/lib/schemas/work-orders.ts, shared with the server), their names and the PATCH that books a visit. No React here.
import { api } from "@/lib/api-client";
import type { SlotWindow } from "@/lib/schemas/work-orders";

export { SLOT_WINDOWS, WORK_ORDER_PRIORITIES, WORK_ORDER_STATUSES, WORK_ORDER_TYPES } from "@/lib/schemas/work-orders";
export type { BookingResponse, SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "@/lib/schemas/work-orders";

// Types' and priorities' names are shared with the server's export.
export { priorityLabels, workTypeNames } from "@/lib/labels";

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
