// The outbox relay: sends what the outbox holds, after the change that queued it has committed.
// The claim with a lease, the backoff and the background loop are the leased queue's
// (server/lib/leased-queue.ts); this is what one attempt at one e-mail is.
// - Every attempt of a row carries the same Message-ID, fixed when it was queued. SMTP cannot give
//   exactly-once delivery: a crash (or a lost reply) between the server accepting the message and
//   our UPDATE to "sent" means it is sent again. That copy has the same Message-ID, so receivers that
//   de-duplicate by it, and our fault script, can drop it. At-least-once, with a delivery key.
import type { DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { LeasedQueueRelay, type LeasedQueueOptions } from "../../lib/leased-queue.js";
import type { Logger } from "../../lib/logger.js";
import type { Mailer } from "../../lib/mailer.js";
import { OutboxEmail } from "./outbox-email.entity.js";
import { SECRET_TEMPLATES } from "./mail-templates.js";

export type MailRelayOptions = LeasedQueueOptions;

export const DEFAULT_RELAY_OPTIONS: MailRelayOptions = {
  maxAttempts: 20,
  baseDelayMs: 30_000,
  maxDelayMs: 3_600_000,
  leaseMs: 5 * 60_000,
  batchSize: 10,
};

export class MailRelay extends LeasedQueueRelay<OutboxEmail> {
  constructor(
    dataSource: DataSource,
    private readonly mailer: Mailer,
    logger: Logger,
    clock: Clock,
    options: Partial<MailRelayOptions> = {},
  ) {
    super(dataSource, logger, clock, { ...DEFAULT_RELAY_OPTIONS, ...options }, OutboxEmail, "the mail relay");
  }

  protected override claimColumns(now: Date) {
    return { lastAttemptAt: now };
  }

  /** One attempt at one claimed row; true when the mail server accepted it. */
  protected async sendOne(row: OutboxEmail): Promise<boolean> {
    const repo = this.repo();
    const mine = this.mine(row);
    if (row.textBody === null) {
      await repo.update(mine, {
        status: "failed",
        leaseToken: null,
        leaseExpiresAt: null,
        error: "The message was not kept, so it cannot be sent.",
      });
      return false;
    }
    try {
      await this.mailer.send({
        to: row.toAddress,
        subject: row.subject,
        text: row.textBody,
        html: row.htmlBody ?? undefined,
        attachments: row.attachments ?? undefined,
        messageId: row.messageId ?? undefined,
      });
    } catch (error) {
      const message = (error instanceof Error ? error.message : String(error)).slice(0, 2000);
      this.logger.warn({ outboxId: row.id, attempts: row.attempts, err: message }, "e-mail could not be sent");
      await repo.update(mine, { ...this.afterFailure(row), error: message });
      return false;
    }
    // Sent, whoever holds the lease now: if ours ran out and another relay took the row, its copy carries the same Message-ID.
    await repo.update(row.id, {
      status: "sent",
      sentAt: this.clock.now(),
      error: null,
      leaseToken: null,
      leaseExpiresAt: null,
      nextAttemptAt: null,
      // A single-use link is not kept once it has gone.
      ...(SECRET_TEMPLATES.has(row.template) ? { textBody: null, htmlBody: null, attachments: null } : {}),
    });
    return true;
  }
}
