import { z } from "zod";
import { COMPLAINT_LETTER_KINDS } from "../domain/complaint-letters.js";
import { calendarDate, id, instant } from "./common.js";

/**
 * Where a complaint stands (our names). Stage 1: received → acknowledged → responded; then either
 * closed or escalated to stage 2: received → acknowledged → closed by the final response.
 */
export const COMPLAINT_STATUSES = [
  "stage-1-received",
  "stage-1-acknowledged",
  "stage-1-responded",
  "stage-2-received",
  "stage-2-acknowledged",
  "closed",
] as const;
export type ComplaintStatus = (typeof COMPLAINT_STATUSES)[number];

const clockState = z.enum(["pending", "met", "missed", "not-started"]);

/** One stage's clocks (src/lib/domain/complaint-clocks.ts), with the extension's reason the tenant is told. */
export const complaintStageResponse = z.object({
  stage: z.union([z.literal(1), z.literal(2)]),
  startedAt: instant.nullable(),
  acknowledgeDueAt: instant.nullable(),
  acknowledgedAt: instant.nullable(),
  acknowledge: clockState,
  respondDueAt: instant.nullable(),
  respondedAt: instant.nullable(),
  respond: clockState,
  extensionWorkingDays: z.number().int().nullable(),
  extensionReason: z.string().nullable(),
  response: z.string().nullable(),
});
export type ComplaintStageResponse = z.infer<typeof complaintStageResponse>;

export const complaintRemedyResponse = z.object({
  apology: z.boolean(),
  apologyText: z.string().nullable(),
  putRight: z.string().nullable(),
  compensationOfferedPence: z.number().int().nullable(),
  compensationOfferedOn: calendarDate.nullable(),
  compensationAcceptedOn: calendarDate.nullable(),
  compensationPaidPence: z.number().int().nullable(),
  compensationPaidOn: calendarDate.nullable(),
});
export type ComplaintRemedyResponse = z.infer<typeof complaintRemedyResponse>;

/** A complaint as its reader may see it: `staffNote` is null for the tenant. */
export const complaintResponse = z.object({
  id,
  caseId: id,
  status: z.enum(COMPLAINT_STATUSES),
  /** Name it in the next move (409 when someone moved it meanwhile). */
  version: z.number().int().positive(),
  raisedAt: instant,
  raisedBy: z.object({ name: z.string(), role: z.string() }).nullable(),
  onBehalf: z.boolean(),
  description: z.string(),
  escalatedAt: instant.nullable(),
  escalationReason: z.string().nullable(),
  closedAt: instant.nullable(),
  stages: z.tuple([complaintStageResponse, complaintStageResponse]),
  remedy: complaintRemedyResponse,
  /** The most one extension may add, from the landlord's policy. */
  extensionMaxWorkingDays: z.number().int(),
  staffNote: z.string().nullable(),
});
export type ComplaintResponse = z.infer<typeof complaintResponse>;

/** GET /api/cases/:id/complaints: the case's complaints, newest first. */
export const complaintListResponse = z.object({ complaints: z.array(complaintResponse) });
export type ComplaintListResponse = z.infer<typeof complaintListResponse>;

export const complaintLetterResponse = z.object({
  kind: z.enum(COMPLAINT_LETTER_KINDS),
  subject: z.string(),
  body: z.string(),
  /** "landlord": the landlord's own wording; "default": ours. */
  source: z.enum(["default", "landlord"]),
});

/** GET/PUT/DELETE /api/policy/complaints: the landlord's complaint timeframes, escalation route and letters. */
export const complaintPolicyResponse = z.object({
  stage1AcknowledgeWorkingDays: z.number().int(),
  stage1RespondWorkingDays: z.number().int(),
  stage2AcknowledgeWorkingDays: z.number().int(),
  stage2RespondWorkingDays: z.number().int(),
  extensionMaxWorkingDays: z.number().int(),
  escalationRoute: z.string(),
  letters: z.array(complaintLetterResponse),
  /** Each placeholder a letter may use, with what it stands for. */
  placeholders: z.array(z.object({ name: z.string(), meaning: z.string() })),
  source: z.enum(["default", "landlord"]),
});
export type ComplaintPolicyResponse = z.infer<typeof complaintPolicyResponse>;
