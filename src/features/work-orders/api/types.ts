// The shapes of the maintenance journey's API (GET/PATCH /api/work-orders, GET/POST /api/contractors),
// as the works contract sets them out. The value lists are shared with the case's works (src/lib/work-orders.ts).
import type { BookingResponse, SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "../lib/work-orders";

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

export interface WorkOrderSlot {
  /** A London calendar date, YYYY-MM-DD. */
  date: string;
  window: SlotWindow;
  startsAt: string;
  endsAt: string;
}

export interface WorkOrderBookingHistory {
  id: number;
  date: string;
  window: SlotWindow;
  assignee: { id: number; name: string } | null;
  contractor: { id: number; name: string } | null;
  state: "active" | "replaced" | "cancelled";
  response: BookingResponse | null;
  reason: string | null;
  createdAt: string;
}

export interface WorkOrder {
  id: number;
  caseId: number;
  caseReference: string | null;
  status: WorkOrderStatus | string;
  type: WorkOrderType | string;
  description: string;
  priority: WorkOrderPriority | string;
  /** YYYY-MM-DD */
  targetDate: string;
  rooms: { id: number; name: string }[];
  property: { id: number; addressLine1: string; town: string; postcode: string; estate: string };
  assignee: { id: number; name: string } | null;
  contractor: { id: number; name: string; email?: string } | null;
  slot: WorkOrderSlot | null;
  /** The tenant's answer to the current booking. */
  booking: { response: BookingResponse | null; reason: string | null; respondedAt: string | null } | null;
  /** Staff only: the booking history. */
  bookings?: WorkOrderBookingHistory[];
  /** Staff only: household notes and vulnerability in words, for the operative. */
  accessNotes?: string | null;
  completion: { at: string; by: string; note: string; materials: string | null; minutesOnSite: number | null; followOn: string | null } | null;
  createdAt: string;
}

export interface WorkOrderPage {
  items: WorkOrder[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ContractorInput {
  name: string;
  email: string;
  phone?: string;
  trade?: string;
}
