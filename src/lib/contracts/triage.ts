import { z } from "zod";
import { AREAS, CASE_STATUSES, CHANNELS } from "../schemas/case-report.js";
import { hazardClass } from "./cases.js";
import { id, idName, instant, pageOf } from "./common.js";
import { DEADLINE_STAGES } from "./inspections.js";
import { surfaceState } from "./psychrometrics.js";

/** One row of the officers' queue (GET /api/cases). */
export const queueItem = z.object({
  id,
  reference: z.string().nullable(),
  status: z.enum(CASE_STATUSES),
  channel: z.enum(CHANNELS),
  awareAt: instant,
  createdAt: instant,
  property: z.object({
    id,
    addressLine1: z.string(),
    town: z.string(),
    postcode: z.string(),
    estate: z.string(),
    block: z.string().nullable(),
  }),
  rooms: z.array(idName),
  /** The worst surface's state; null while the case has no readings. */
  riskState: surfaceState.nullable(),
  /** VTT mould index, 0 to 6; null when none has been worked out. */
  mouldIndex: z.number().min(0).max(6).nullable(),
  area: z.enum(AREAS).nullable(),
  vulnerableHousehold: z.boolean(),
  hazardClass: hazardClass.nullable(),
  /** The latest HHSRS assessment; null before the first. */
  hhsrs: z.object({ band: z.string(), category: z.union([z.literal(1), z.literal(2)]) }).nullable(),
  /** Triage priority, 0 to 100. */
  priority: z.number().min(0).max(100),
  nextDeadline: z.object({ stage: z.enum(DEADLINE_STAGES), dueAt: instant }).nullable(),
  overdue: z.boolean(),
  assignee: idName.nullable(),
});
export type QueueItemResponse = z.infer<typeof queueItem>;
export const queuePageResponse = pageOf(queueItem);
export type QueuePageResponse = z.infer<typeof queuePageResponse>;

/** POST /api/cases/bulk. */
export const bulkUpdateResponse = z.object({
  updated: z.array(id),
  failed: z.array(z.object({ id, reference: z.string().nullable(), message: z.string() })),
});
export type BulkUpdateResponse = z.infer<typeof bulkUpdateResponse>;

/**
 * POST /api/cases/bulk/preview: for the chosen cases, the moves every one of them can make
 * (`common`), and per case where it is and where it could go, so a bulk change offers only valid
 * moves or names the cases it would skip before it is confirmed.
 */
export const bulkPreviewResponse = z.object({
  common: z.array(z.enum(CASE_STATUSES)),
  cases: z.array(
    z.object({
      id,
      reference: z.string().nullable(),
      status: z.enum(CASE_STATUSES),
      allowed: z.array(z.enum(CASE_STATUSES)),
    }),
  ),
  /** With `status` asked for: the cases that cannot make that move and would be skipped. */
  skipped: z.array(z.object({ id, reference: z.string().nullable(), status: z.enum(CASE_STATUSES) })),
});
export type BulkPreviewResponse = z.infer<typeof bulkPreviewResponse>;

/** GET /api/cases/:id/triage: the priority and how it was worked out. */
export const triageResponse = z.object({
  score: z.number(),
  parts: z.array(z.object({ factor: z.string(), points: z.number(), max: z.number(), explanation: z.string() })),
  computedAt: instant,
});
export type TriageResponse = z.infer<typeof triageResponse>;
