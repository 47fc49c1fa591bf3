// The shapes of the maintenance journey's API (GET/PATCH /api/work-orders, GET/POST /api/contractors),
// as the works contract sets them out. The client keeps its own copy of the value lists: it never
// imports server code.

export const WORK_ORDER_TYPES = [
  "extractor-fan",
  "fan-upgrade",
  "trickle-vents",
  "door-undercut",
  "piv-unit",
  "mould-wash",
  "mould-resistant-decoration",
  "insulation",
  "draught-proofing",
  "heating",
  "leak-repair",
  "roof-gutter",
  "damp-proofing",
  "other",
] as const;
export type WorkOrderType = (typeof WORK_ORDER_TYPES)[number];

export const WORK_ORDER_PRIORITIES = ["emergency", "urgent", "routine"] as const;
export type WorkOrderPriority = (typeof WORK_ORDER_PRIORITIES)[number];

/** unscheduled → scheduled (proposed to the tenant) → confirmed | change-requested → (scheduled again) → done; or cancelled. */
export const WORK_ORDER_STATUSES = ["unscheduled", "scheduled", "change-requested", "confirmed", "done", "cancelled"] as const;
export type WorkOrderStatus = (typeof WORK_ORDER_STATUSES)[number];

/** am 8–12, pm 12–17, all-day 8–17, London time. */
export const SLOT_WINDOWS = ["am", "pm", "all-day"] as const;
export type SlotWindow = (typeof SLOT_WINDOWS)[number];

export type BookingResponse = "confirmed" | "change-requested";

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

/** PATCH /api/work-orders/:id to book (or rebook) an operative or a contractor. */
export type ScheduleBody =
  | { assigneeId: number; slot: { date: string; window: SlotWindow } }
  | { contractorId: number; slot: { date: string; window: SlotWindow } };

export interface Contractor {
  id: number;
  name: string;
  email: string;
  phone: string | null;
  trade: string | null;
}

export interface ContractorInput {
  name: string;
  email: string;
  phone?: string;
  trade?: string;
}
