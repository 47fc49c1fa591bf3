// The outbox relay: sends what the outbox holds, after the change that queued it has committed.
//
// - A row is claimed with a lease (status "sending", a random token, an expiry) by a conditional
//   UPDATE, so two relays (two app instances) never send the same row at the same time; a relay that
//   dies holding a row leaves it to whoever finds the lease expired.
// - A failed attempt puts the row back to "pending" with the error and a later `next_attempt_at`
//   (exponential backoff); after the last attempt it is "failed" and staff can resend it.
// - Every attempt of a row carries the same Message-ID, fixed when it was queued. SMTP cannot give
//   exactly-once delivery: a crash (or a lost reply) between the server accepting the message and
//   our UPDATE to "sent" means it is sent again. That copy has the same Message-ID, so receivers that
//   de-duplicate by it, and our fault script, can drop it. At-least-once, with a delivery key.
// - It never runs inside a request: `wake()` starts a drain in the background and returns at once.
import { randomBytes } from "node:crypto";
import { Brackets, type DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
import type { Mailer } from "../../lib/mailer.js";
import { OutboxEmail } from "./outbox-email.entity.js";
import { SECRET_TEMPLATES } from "./mail-templates.js";

export interface MailRelayOptions {
  /** Attempts before a row is given up as "failed". */
  maxAttempts: number;
  /** The first retry waits this long; each further one twice as long, up to `maxDelayMs`. */
  baseDelayMs: number;
  maxDelayMs: number;
  /** How long a claim lasts: longer than any one SMTP call can take with its timeouts. */
  leaseMs: number;
  /** Rows claimed per round. */
  batchSize: number;
}

export const DEFAULT_RELAY_OPTIONS: MailRelayOptions = {
  maxAttempts: 20,
  baseDelayMs: 30_000,
  maxDelayMs: 3_600_000,
  leaseMs: 5 * 60_000,
  batchSize: 10,
};

/** The wait before the next attempt, after `attempts` attempts have failed. */
export const backoffMs = (attempts: number, o: Pick<MailRelayOptions, "baseDelayMs" | "maxDelayMs">): number =>
  Math.min(o.maxDelayMs, o.baseDelayMs * 2 ** Math.max(0, Math.min(attempts - 1, 30)));

const token = () => randomBytes(12).toString("base64url");

export class MailRelay {
  private readonly options: MailRelayOptions;
  private running: Promise<void> | null = null;
  private again = false;
  private stopped = false;

  constructor(
    private readonly dataSource: DataSource,
    private readonly mailer: Mailer,
    private readonly logger: Logger,
    private readonly clock: Clock,
    options: Partial<MailRelayOptions> = {},
  ) {
    this.options = { ...DEFAULT_RELAY_OPTIONS, ...options };
  }

  /** Starts sending what is due, in the background (after a commit that queued e-mail). Never throws, never waits. */
  wake(): void {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    this.running = (async () => {
      try {
        do {
          this.again = false;
          await this.drain();
        } while (this.again && !this.stopped);
      } catch (error) {
        // The database may be away; the next wake or tick tries again.
        this.logger.warn({ err: error instanceof Error ? error.message : String(error) }, "the mail relay could not run");
      } finally {
        this.running = null;
      }
    })();
  }

  /** Resolves when no drain started by wake() is running (everything due has been tried). */
  async idle(): Promise<void> {
    while (this.running) await this.running;
  }

  /** Claims and sends due rows until none is left; returns how many were sent. Tests call it directly. */
  async drain(): Promise<number> {
    let sent = 0;
    for (;;) {
      if (this.stopped) return sent;
      const claimed = await this.claim();
      if (!claimed.length) return sent;
      for (const row of claimed) if (await this.sendOne(row)) sent += 1;
    }
  }

  /**
   * Wakes now (picking up rows a crash left pending, or sending with an expired lease) and every
   * `everyMs`; the returned function stops the timer and waits for a send in progress to finish
   * (each SMTP call is bounded by its timeouts).
   */
  start({ everyMs }: { everyMs: number }): () => Promise<void> {
    this.stopped = false;
    this.wake();
    const timer = setInterval(() => this.wake(), everyMs);
    timer.unref();
    return async () => {
      clearInterval(timer);
      await this.stop();
    };
  }

  /** No new claims from now on; resolves once the round in progress has finished. */
  async stop(): Promise<void> {
    this.stopped = true;
    await this.idle();
  }

  /** Leases up to batchSize due rows to this relay. */
  private async claim(): Promise<OutboxEmail[]> {
    const now = this.clock.now();
    const repo = this.dataSource.getRepository(OutboxEmail);
    // Due: pending and its time has come, or claimed by a relay whose lease has run out (it died or hung).
    const due = new Brackets((w) =>
      w
        .where("status = 'pending' AND next_attempt_at <= :now", { now })
        .orWhere("status = 'sending' AND lease_expires_at <= :now", { now }),
    );
    const candidates = await repo
      .createQueryBuilder()
      .select("id", "id")
      .where(due)
      .orderBy("next_attempt_at", "ASC")
      .limit(this.options.batchSize)
      .getRawMany<{ id: number }>();
    const claimed: OutboxEmail[] = [];
    for (const { id } of candidates) {
      const lease = token();
      // The same due condition again, in one statement: of two relays racing for a row, only one UPDATE matches.
      const result = await repo
        .createQueryBuilder()
        .update(OutboxEmail)
        .set({
          status: "sending",
          leaseToken: lease,
          leaseExpiresAt: new Date(now.getTime() + this.options.leaseMs),
          lastAttemptAt: now,
          attempts: () => "attempts + 1",
        })
        .where("id = :id", { id })
        .andWhere(due)
        .execute();
      if (result.affected === 1) {
        const row = await repo.findOneBy({ id, leaseToken: lease });
        if (row) claimed.push(row);
      }
    }
    return claimed;
  }

  /** One attempt at one claimed row; true when the mail server accepted it. */
  private async sendOne(row: OutboxEmail): Promise<boolean> {
    const repo = this.dataSource.getRepository(OutboxEmail);
    const mine = { id: row.id, leaseToken: row.leaseToken! };
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
      const last = row.attempts >= this.options.maxAttempts;
      this.logger.warn({ outboxId: row.id, attempts: row.attempts, err: message }, "e-mail could not be sent");
      await repo.update(mine, {
        status: last ? "failed" : "pending",
        error: message,
        leaseToken: null,
        leaseExpiresAt: null,
        nextAttemptAt: last ? null : new Date(this.clock.now().getTime() + backoffMs(row.attempts, this.options)),
      });
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
