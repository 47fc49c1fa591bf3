import type { TextOutboxItem } from "../../../src/lib/contracts/sms.js";
import type { OutboxSms } from "./outbox-sms.entity.js";

/** A text outbox row as staff see it. */
export const toTextOutboxItemDto = (o: OutboxSms): TextOutboxItem => ({
  id: o.id,
  kind: o.kind,
  to: o.toNumber,
  body: o.body,
  status: o.status,
  attempts: o.attempts,
  error: o.error,
  providerId: o.providerId,
  createdAt: o.createdAt.toISOString(),
  lastAttemptAt: o.lastAttemptAt?.toISOString() ?? null,
  nextAttemptAt: o.status === "pending" ? (o.nextAttemptAt?.toISOString() ?? null) : null,
  sentAt: o.sentAt?.toISOString() ?? null,
  case: o.relatedType === "case" && o.relatedId !== null ? { id: o.relatedId } : null,
});
