import type { OutboxItem } from "../../../src/lib/contracts/mail.js";
import type { OutboxEmail } from "./outbox-email.entity.js";

/** An outbox row as staff see it: its state, never its text. */
export const toOutboxItemDto = (o: OutboxEmail): OutboxItem => ({
  id: o.id,
  to: o.toAddress,
  subject: o.subject,
  template: o.template,
  status: o.status,
  attempts: o.attempts,
  error: o.error,
  createdAt: o.createdAt.toISOString(),
  lastAttemptAt: o.lastAttemptAt?.toISOString() ?? null,
  nextAttemptAt: o.status === "pending" ? (o.nextAttemptAt?.toISOString() ?? null) : null,
  sentAt: o.sentAt?.toISOString() ?? null,
  resentAt: o.resentAt?.toISOString() ?? null,
  case: o.relatedType === "case" && o.relatedId !== null ? { id: o.relatedId } : null,
});
