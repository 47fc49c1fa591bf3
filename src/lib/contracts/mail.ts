// The outbox as staff see it: each e-mail's state, without its text (which may hold a tenant's words
// or a link meant for one person).
import { z } from "zod";
import { id, instant, pageOf } from "./common.js";

/** pending: waiting for its first try or a retry; sending: being sent now; sent: the mail server took it; failed: given up. */
export const OUTBOX_STATUSES = ["pending", "sending", "sent", "failed"] as const;
export const outboxStatus = z.enum(OUTBOX_STATUSES);
export type OutboxStatusName = z.infer<typeof outboxStatus>;

/** One e-mail in GET /api/outbox, and the reply of POST /api/outbox/:id/resend. */
export const outboxItem = z.object({
  id,
  to: z.string(),
  subject: z.string(),
  template: z.string(),
  status: outboxStatus,
  attempts: z.number().int().min(0),
  /** The last attempt's error (null once sent). */
  error: z.string().nullable(),
  createdAt: instant,
  lastAttemptAt: instant.nullable(),
  nextAttemptAt: instant.nullable(),
  sentAt: instant.nullable(),
  resentAt: instant.nullable(),
  /** The case the e-mail is about, when it is about one. */
  case: z.object({ id }).nullable(),
});
export type OutboxItem = z.infer<typeof outboxItem>;
export const outboxPageResponse = pageOf(outboxItem);
export type OutboxPage = z.infer<typeof outboxPageResponse>;
