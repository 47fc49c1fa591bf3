// The shapes of the maintenance journey's API (the works contract: server/modules/works), as the
// case workspace and the tenant's case page read and send them.
import type { BeforeAfter } from "@/lib/domain/verification";
import type { BookingResponse, ScheduleBody, SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "../lib/work-orders";

export {
  SLOT_WINDOWS,
  WORK_ORDER_PRIORITIES,
  WORK_ORDER_TYPES,
  type BookingResponse,
  type SlotWindow,
  type WorkOrderPriority,
  type WorkOrderStatus,
  type WorkOrderType,
} from "../lib/work-orders";
export type { Contractor } from "@/lib/contractors";

export interface Slot {
  /** A London calendar date, YYYY-MM-DD. */
  date: string;
  window: SlotWindow | string;
  startsAt?: string;
  endsAt?: string;
}

export interface BookingAnswer {
  response: BookingResponse | string | null;
  reason: string | null;
  respondedAt: string | null;
}

export interface BookingHistoryItem {
  id: number;
  date: string;
  window: SlotWindow | string;
  assignee: { id: number; name: string } | null;
  contractor: { id: number; name: string } | null;
  state: "active" | "replaced" | "cancelled" | string;
  response: BookingResponse | string | null;
  reason: string | null;
  createdAt: string;
}

export interface Completion {
  at: string;
  by: string;
  note: string;
  materials: string | null;
  minutesOnSite: number | null;
  followOn: string | null;
}

export interface WorkOrder {
  id: number;
  caseId: number;
  caseReference: string | null;
  status: WorkOrderStatus | string;
  type: WorkOrderType | string;
  description: string;
  priority: WorkOrderPriority | string;
  targetDate: string | null;
  rooms: { id: number; name: string }[];
  property?: { id: number; addressLine1?: string; town?: string; postcode?: string; estate?: string };
  assignee: { id: number; name: string } | null;
  contractor: { id: number; name: string; email?: string } | null;
  slot: Slot | null;
  booking: BookingAnswer | null;
  /** Staff only: every booking, the replaced ones too. */
  bookings?: BookingHistoryItem[];
  /** Staff only: what the operative should know before the visit. */
  accessNotes?: string | null;
  completion: Completion | null;
  createdAt: string;
}

/** POST /api/cases/:id/work-orders. */
export interface WorkOrderInput {
  type: WorkOrderType;
  description: string;
  roomIds?: number[];
  priority?: WorkOrderPriority;
  targetDate?: string;
}

/** PATCH /api/work-orders/:id, one of three changes. */
export type WorkOrderPatch =
  | ScheduleBody
  | { complete: CompletionInput }
  | { cancel: { reason: string } };

export interface CompletionInput {
  note: string;
  materials?: string;
  minutesOnSite?: number;
  followOn?: string;
}

export interface WorkPhoto {
  id: number;
  url: string;
  thumbnailUrl: string;
  width: number;
  height: number;
  sha256: string;
  createdAt: string;
  /** Set for the photos taken after a work order's works. */
  workOrderId?: number | null;
}

export type VerificationState = "no-works" | "monitoring" | "ended" | "decided";

export interface RoomComparison {
  roomId: number;
  roomName: string;
  comparison: BeforeAfter;
}

export interface VerificationOutcome {
  effective: boolean;
  note: string;
  at: string;
  by: string;
}

export interface Verification {
  state: VerificationState | string;
  worksDoneAt: string | null;
  monitoringEndsAt: string | null;
  monitoringDays: number;
  rooms: RoomComparison[];
  outcome: VerificationOutcome | null;
}

/** POST /api/cases/:id/verification. */
export type VerificationInput =
  | { effective: true; note: string }
  | { effective: false; note: string; workOrder: WorkOrderInput };

export type { BeforeAfter, PeriodSummary } from "@/lib/domain/verification";
