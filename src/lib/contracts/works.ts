import { z } from "zod";
import { SLOT_WINDOWS, WORK_ORDER_PRIORITIES, WORK_ORDER_STATUSES, WORK_ORDER_TYPES } from "../schemas/work-orders.js";
import { calendarDate, id, idName, instant, pageOf } from "./common.js";
import { beforeAfter } from "./psychrometrics.js";

export const BOOKING_RESPONSES = ["confirmed", "change-requested"] as const;
export const BOOKING_STATES = ["active", "replaced", "cancelled"] as const;

/** Someone named on a booking; the name is null only if the account has gone. */
const named = z.object({ id, name: z.string().nullable() });

export const workOrderSlot = z.object({
  /** A London calendar date. */
  date: calendarDate,
  window: z.enum(SLOT_WINDOWS),
  startsAt: instant,
  endsAt: instant,
});

export const bookingHistoryItem = z.object({
  id,
  date: calendarDate,
  window: z.enum(SLOT_WINDOWS),
  assignee: named.nullable(),
  contractor: named.nullable(),
  state: z.enum(BOOKING_STATES),
  response: z.enum(BOOKING_RESPONSES).nullable(),
  reason: z.string().nullable(),
  createdAt: instant,
});

export const completion = z.object({
  /** When the work was done (the end of the working day for an earlier date). */
  at: instant,
  /** The London date the work was done, as entered (null on orders completed before it was asked). */
  doneOn: calendarDate.nullable(),
  /** Staff only (null for the tenant): why the work was done before the booked day. */
  earlyReason: z.string().nullable(),
  by: z.string().nullable(),
  note: z.string().nullable(),
  /** Staff only (null for the tenant). */
  materials: z.string().nullable(),
  minutesOnSite: z.number().int().nullable(),
  followOn: z.string().nullable(),
});

/** A work order (GET /api/work-orders, GET/POST /api/cases/:id/work-orders, PATCH /api/work-orders/:id…). */
export const workOrderResponse = z.object({
  id,
  caseId: id,
  caseReference: z.string().nullable(),
  status: z.enum(WORK_ORDER_STATUSES),
  type: z.enum(WORK_ORDER_TYPES),
  /** Staff only: what needs doing, for the operative. Never sent to the tenant. */
  description: z.string().optional(),
  priority: z.enum(WORK_ORDER_PRIORITIES),
  targetDate: calendarDate,
  rooms: z.array(idName),
  property: z.object({ id, addressLine1: z.string(), town: z.string(), postcode: z.string(), estate: z.string() }),
  assignee: idName.nullable(),
  /** The e-mail address only for staff. */
  contractor: z.object({ id, name: z.string(), email: z.string().optional() }).nullable(),
  slot: workOrderSlot.nullable(),
  /** The tenant's answer to the current booking. */
  booking: z
    .object({ response: z.enum(BOOKING_RESPONSES).nullable(), reason: z.string().nullable(), respondedAt: instant.nullable() })
    .nullable(),
  /** Staff only: every booking, the replaced ones too. */
  bookings: z.array(bookingHistoryItem).optional(),
  /** Staff only: household notes and vulnerability in words, for the operative. */
  accessNotes: z.string().nullable().optional(),
  completion: completion.nullable(),
  createdAt: instant,
});
export type WorkOrderResponse = z.infer<typeof workOrderResponse>;
export const workOrderPageResponse = pageOf(workOrderResponse);
export type WorkOrderPageResponse = z.infer<typeof workOrderPageResponse>;
export const caseWorkOrdersResponse = z.object({ workOrders: z.array(workOrderResponse) });

/** A contractor (GET/POST /api/contractors). */
export const contractorResponse = z.object({
  id,
  name: z.string(),
  email: z.string(),
  phone: z.string().nullable(),
  trade: z.string().nullable(),
});
export type ContractorResponse = z.infer<typeof contractorResponse>;
export const contractorListResponse = z.object({ contractors: z.array(contractorResponse) });

export const VERIFICATION_STATES = ["no-works", "monitoring", "ended", "decided"] as const;

/** GET/POST /api/cases/:id/verification: readings before and after the works, and the lead's verdict. */
export const verificationResponse = z.object({
  state: z.enum(VERIFICATION_STATES),
  worksDoneAt: instant.nullable(),
  monitoringEndsAt: instant.nullable(),
  monitoringDays: z.number().int(),
  rooms: z.array(z.object({ roomId: id, roomName: z.string(), comparison: beforeAfter })),
  /** An affected room has enough readings after the works to compare: "fix effective" needs this or an override. */
  enoughReadings: z.boolean(),
  outcome: z
    .object({
      effective: z.boolean(),
      note: z.string(),
      at: instant,
      by: z.string().nullable(),
      /** Staff only (null for the tenant): why "fix effective" was recorded without enough readings. */
      override: z.string().nullable(),
    })
    .nullable(),
});
export type VerificationResponse = z.infer<typeof verificationResponse>;
