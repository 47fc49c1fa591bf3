// The shapes of the maintenance journey's API as the case workspace and the tenant's case page read
// them (inferred from the API contract, src/lib/contracts/works.ts), and the requests they send.
import type { PhotoResponse, VerificationResponse, WorkOrderResponse } from "@/lib/contracts";
import type { ScheduleBody, WorkOrderPriority, WorkOrderType } from "../lib/work-orders";

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

export type WorkOrder = WorkOrderResponse;
export type Slot = NonNullable<WorkOrder["slot"]>;
export type BookingAnswer = NonNullable<WorkOrder["booking"]>;
export type BookingHistoryItem = NonNullable<WorkOrder["bookings"]>[number];
export type Completion = NonNullable<WorkOrder["completion"]>;

/** POST /api/cases/:id/work-orders. */
export interface WorkOrderInput {
  type: WorkOrderType;
  description: string;
  roomIds?: number[];
  priority?: WorkOrderPriority;
  targetDate?: string;
}

/** PATCH /api/work-orders/:id, one of three changes. */
export type WorkOrderPatch = ScheduleBody | { complete: CompletionInput } | { cancel: { reason: string } };

export interface CompletionInput {
  note: string;
  materials?: string;
  minutesOnSite?: number;
  followOn?: string;
  /** The London date the work was done (YYYY-MM-DD): today or earlier. */
  doneOn: string;
  /** Why the work was done before the booked day; required when it was. */
  earlyReason?: string;
  /** The type of the order raised for the follow-on work (other by default). */
  followOnType?: WorkOrderType;
}

export type WorkPhoto = PhotoResponse;

export type Verification = VerificationResponse;
export type VerificationState = Verification["state"];
export type RoomComparison = Verification["rooms"][number];
export type VerificationOutcome = NonNullable<Verification["outcome"]>;

/** POST /api/cases/:id/verification. */
export type VerificationInput =
  | { effective: true; note: string; override?: { reason: string } }
  | { effective: false; note: string; workOrder: WorkOrderInput };

export type { BeforeAfter, PeriodSummary } from "@/lib/domain/verification";
