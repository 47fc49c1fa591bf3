// The work-order vocabulary of the API, shared by the server (entities, zod schemas) and the client.

/** The trade's usual remedies for damp and mould. */
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

/**
 * unscheduled → scheduled (an appointment proposed to the tenant) → confirmed by the tenant, or
 * change-requested (the tenant asked for another slot) → scheduled again → done. cancelled at any point before done.
 */
export const WORK_ORDER_STATUSES = ["unscheduled", "scheduled", "change-requested", "confirmed", "done", "cancelled"] as const;
export type WorkOrderStatus = (typeof WORK_ORDER_STATUSES)[number];

/** Appointment windows, London time: morning 8–12, afternoon 12–5, all day 8–5 (ours). */
export const SLOT_WINDOWS = ["am", "pm", "all-day"] as const;
export type SlotWindow = (typeof SLOT_WINDOWS)[number];

export type BookingResponse = "confirmed" | "change-requested";
