// Text messages to tenants: a tenant's number and on/off choice, and the text outbox as staff see it.
import { z } from "zod";
import { id, instant, pageOf } from "./common.js";

/** GET/PUT /api/me/texts (the tenant's own) and GET /api/cases/:id/text-choice (staff: the case's tenant's). */
export const textChoiceResponse = z.object({
  /** The number in one form (+447…), or null when none is given. */
  mobileNumber: z.string().nullable(),
  /** Texts are off until the tenant turns them on. */
  textsOn: z.boolean(),
});
export type TextChoiceResponse = z.infer<typeof textChoiceResponse>;

export const TEXT_STATUSES = ["pending", "sending", "sent", "failed"] as const;

/** One text in GET /api/text-outbox: its state and what it said (texts hold no staff-only words). */
export const textOutboxItem = z.object({
  id,
  kind: z.string(),
  to: z.string(),
  body: z.string(),
  status: z.enum(TEXT_STATUSES),
  attempts: z.number().int().min(0),
  error: z.string().nullable(),
  /** The provider's id, once it accepted the text. */
  providerId: z.string().nullable(),
  createdAt: instant,
  lastAttemptAt: instant.nullable(),
  nextAttemptAt: instant.nullable(),
  sentAt: instant.nullable(),
  case: z.object({ id }).nullable(),
});
export type TextOutboxItem = z.infer<typeof textOutboxItem>;
export const textOutboxPageResponse = pageOf(textOutboxItem);
