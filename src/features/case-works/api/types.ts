// The shapes of the maintenance journey's API (the works contract: server/modules/works), as the
// case workspace and the tenant's case page read and send them.
import type { BeforeAfter } from "@/lib/domain/verification";

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

export type WorkOrderStatus = "unscheduled" | "scheduled" | "confirmed" | "change-requested" | "done" | "cancelled";

export const SLOT_WINDOWS = ["am", "pm", "all-day"] as const;
export type SlotWindow = (typeof SLOT_WINDOWS)[number];

export interface Slot {
  /** A London calendar date, YYYY-MM-DD. */
  date: string;
  window: SlotWindow | string;
  startsAt?: string;
  endsAt?: string;
}

export type BookingResponse = "confirmed" | "change-requested";

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
  | { assigneeId: number; slot: { date: string; window: SlotWindow } }
  | { contractorId: number; slot: { date: string; window: SlotWindow } }
  | { complete: CompletionInput }
  | { cancel: { reason: string } };

export interface CompletionInput {
  note: string;
  materials?: string;
  minutesOnSite?: number;
  followOn?: string;
}

export interface Contractor {
  id: number;
  name: string;
  email: string;
  phone?: string | null;
  trade?: string | null;
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
