// The shapes of the maintenance journey's API (GET/PATCH /api/work-orders, GET/POST /api/contractors),
// inferred from the API contract (src/lib/contracts/works.ts). The value lists are shared with the case's works (src/lib/work-orders.ts).
import type { WorkOrderPageResponse, WorkOrderResponse } from "@/lib/contracts";

export {
  SLOT_WINDOWS,
  WORK_ORDER_PRIORITIES,
  WORK_ORDER_STATUSES,
  WORK_ORDER_TYPES,
  type BookingResponse,
  type ScheduleBody,
  type SlotWindow,
  type WorkOrderPriority,
  type WorkOrderStatus,
  type WorkOrderType,
} from "../lib/work-orders";
export type { Contractor } from "@/lib/contractors";

export type WorkOrder = WorkOrderResponse;
export type WorkOrderSlot = NonNullable<WorkOrder["slot"]>;
export type WorkOrderBookingHistory = NonNullable<WorkOrder["bookings"]>[number];
export type WorkOrderPage = WorkOrderPageResponse;

/** POST /api/contractors (server/modules/works/works.schemas.ts). */
export interface ContractorInput {
  name: string;
  email: string;
  phone?: string;
  trade?: string;
}
