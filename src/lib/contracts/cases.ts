import { z } from "zod";
import {
  AREAS,
  CASE_STATUSES,
  CHANNELS,
  DURATIONS,
  EQUIPMENT_ANSWERS,
  HEATING_COST_ANSWERS,
  LOCATIONS,
  OBSERVATIONS,
  VULNERABILITIES,
} from "../schemas/case-report.js";
import { ROOM_KINDS } from "../homes.js";
import { id, instant } from "./common.js";

/** Kept here, not imported from src/lib/domain/deadlines.ts (that would pull the holiday data into the browser). */
export const HAZARD_CLASSES = ["emergency", "significant", "not-significant"] as const;
export const hazardClass = z.enum(HAZARD_CLASSES);

const caseRoom = z.object({ id, name: z.string(), kind: z.enum(ROOM_KINDS) });
const equipmentAnswer = z.enum(EQUIPMENT_ANSWERS);

/** A case (GET /api/cases/:id, POST /api/cases, PATCH /api/cases/:id). */
export const caseResponse = z.object({
  id,
  /** "DW-2026-00042"; null only for a case still being numbered. */
  reference: z.string().nullable(),
  status: z.enum(CASE_STATUSES),
  assigneeId: id.nullable(),
  tenantUserId: id.nullable(),
  hazardClass: hazardClass.nullable(),
  hazardClassReason: z.string().nullable(),
  channel: z.enum(CHANNELS),
  awareAt: instant,
  createdAt: instant,
  description: z.string(),
  locations: z.array(z.enum(LOCATIONS)),
  observations: z.array(z.enum(OBSERVATIONS)),
  since: z.enum(DURATIONS).nullable(),
  area: z.enum(AREAS).nullable(),
  vulnerability: z.array(z.enum(VULNERABILITIES)).nullable(),
  equipment: z
    .object({
      heatingUsable: equipmentAnswer.optional(),
      extractorFanWorks: equipmentAnswer.optional(),
      trickleVentsOpen: equipmentAnswer.optional(),
      heatingCost: z.enum(HEATING_COST_ANSWERS).optional(),
    })
    .nullable(),
  /** The whole address, or only the id when the home was not loaded with the case. */
  property: z.object({
    id,
    addressLine1: z.string().optional(),
    addressLine2: z.string().nullable().optional(),
    town: z.string().optional(),
    postcode: z.string().optional(),
    estate: z.string().optional(),
  }),
  rooms: z.array(caseRoom),
  homeRooms: z.array(caseRoom),
});
export type CaseResponse = z.infer<typeof caseResponse>;

/** GET /api/me/cases: the tenant's cases, each with its photo count and first thumbnail. */
export const myCaseResponse = caseResponse.extend({ photoCount: z.number().int().min(0), thumbnailUrl: z.string().nullable() });
export type MyCaseResponse = z.infer<typeof myCaseResponse>;
export const myCasesResponse = z.object({ items: z.array(myCaseResponse) });

export const caseEventEmail = z.object({
  status: z.enum(["pending", "sending", "sent", "failed"]),
  to: z.string(),
  template: z.string(),
  sentAt: instant.nullable(),
  error: z.string().nullable(),
  /** Attempts so far (a failed attempt is retried later, until the relay gives up). */
  attempts: z.number().int().min(0).optional(),
});
export type CaseEventEmail = z.infer<typeof caseEventEmail>;

export const caseEventText = z.object({
  status: z.enum(["pending", "sending", "sent", "failed"]),
  sentAt: instant.nullable(),
  error: z.string().nullable(),
  attempts: z.number().int().min(0),
  /** The provider's id for the text, once it accepted it. */
  providerId: z.string().nullable(),
});
export type CaseEventText = z.infer<typeof caseEventText>;

/** One entry of a case's timeline (GET /api/cases/:id/events). */
export const caseEventResponse = z.object({
  id,
  type: z.string(),
  at: instant,
  actor: z.object({ name: z.string(), role: z.string() }).nullable(),
  before: z.record(z.string(), z.unknown()).nullable(),
  after: z.record(z.string(), z.unknown()).nullable(),
  /** Staff only: the e-mail this event queued, and how its sending went (null for tenants). */
  email: caseEventEmail.nullable(),
  /** Staff only: the text message this event queued, and how its sending went (null for tenants). */
  text: caseEventText.nullable().optional(),
});
export type CaseEventResponse = z.infer<typeof caseEventResponse>;
export const caseEventsResponse = z.object({ events: z.array(caseEventResponse) });

/** GET /api/cases/:id/related: other cases of the same home. */
export const relatedCase = z.object({
  id,
  reference: z.string().nullable(),
  status: z.enum(CASE_STATUSES),
  awareAt: instant,
  hazardClass: hazardClass.nullable(),
  description: z.string(),
});
export type RelatedCase = z.infer<typeof relatedCase>;
export const relatedCasesResponse = z.object({ cases: z.array(relatedCase) });

/**
 * POST /api/cases/:id/worse: what the tenant's "it's got worse" did. `told` says who was e-mailed
 * (the assignee, else the landlord's officers; "nobody" when the landlord has no active officer),
 * so the tenant is told only what is true.
 */
export const worseResponse = z.object({
  status: z.enum(CASE_STATUSES),
  reopened: z.boolean(),
  told: z.enum(["assignee", "officers", "nobody"]),
});
export type WorseResponse = z.infer<typeof worseResponse>;
