// The webhook relay: sends what webhook_deliveries holds, after the change that queued it has committed.
// The same shape as the e-mail outbox relay (server/modules/mail/mail.relay.ts):
// - a row is claimed with a lease by a conditional UPDATE, so two relays never send it at once, and a
//   relay that dies holding one leaves it to whoever finds the lease expired (nothing is lost on restart);
// - a failed attempt (no answer, a timeout, anything but 2xx) puts it back to "pending" with a later
//   `next_attempt_at` (doubling backoff); after the last attempt it is "failed" and an admin can send it again;
// - every attempt is stored (time, status code or error, duration) for the admin to see.
// At-least-once: a crash between the receiver's 2xx and our UPDATE sends it again, with the same
// Dewline-Event-Id, which is what receivers de-duplicate by.
import { randomBytes } from "node:crypto";
import { performance } from "node:perf_hooks";
import { Brackets, type DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
import { WebhookAttempt } from "./webhook-attempt.entity.js";
import { WebhookDelivery } from "./webhook-delivery.entity.js";
import { type WebhookEndpoint } from "./webhook-endpoint.entity.js";
import { type WebhookEvent } from "./webhook-event.entity.js";
import { ATTEMPT_HEADER, EVENT_ID_HEADER, EVENT_TYPE_HEADER, SIGNATURE_HEADER, signatureHeader } from "./webhook-signature.js";

export interface WebhookRelayOptions {
  maxAttempts: number;
  /** The first retry waits this long; each further one twice as long, up to `maxDelayMs`. */
  baseDelayMs: number;
  maxDelayMs: number;
  /** Each HTTP call's limit (connect, send, answer), through AbortSignal.timeout. */
  timeoutMs: number;
  /** How long a claim lasts: longer than any one call with its timeout. */
  leaseMs: number;
  batchSize: number;
}

export const DEFAULT_WEBHOOK_RELAY_OPTIONS: WebhookRelayOptions = {
  maxAttempts: 12,
  baseDelayMs: 30_000,
  maxDelayMs: 3_600_000,
  timeoutMs: 10_000,
  leaseMs: 60_000,
  batchSize: 10,
};

/** The wait before the next attempt, after `attempts` attempts have failed. */
export const webhookBackoffMs = (attempts: number, o: Pick<WebhookRelayOptions, "baseDelayMs" | "maxDelayMs">): number =>
  Math.min(o.maxDelayMs, o.baseDelayMs * 2 ** Math.max(0, Math.min(attempts - 1, 30)));

const token = () => randomBytes(12).toString("base64url");
const short = (text: string) => text.slice(0, 500);

export class WebhookRelay {
  private readonly options: WebhookRelayOptions;
  private running: Promise<void> | null = null;
  private again = false;
  private stopped = false;

  constructor(
    private readonly dataSource: DataSource,
    private readonly logger: Logger,
    private readonly clock: Clock,
    options: Partial<WebhookRelayOptions> = {},
  ) {
    this.options = { ...DEFAULT_WEBHOOK_RELAY_OPTIONS, ...options };
  }

  /** Starts sending what is due, in the background. Never throws, never waits. */
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
        this.logger.warn({ err: error instanceof Error ? error.message : String(error) }, "the webhook relay could not run");
      } finally {
        this.running = null;
      }
    })();
  }

  /** Resolves when no drain started by wake() is running. */
  async idle(): Promise<void> {
    while (this.running) await this.running;
  }

  /** Claims and sends due deliveries until none is left; returns how many were delivered. Tests call it directly. */
  async drain(): Promise<number> {
    let delivered = 0;
    for (;;) {
      if (this.stopped) return delivered;
      const claimed = await this.claim();
      if (!claimed.length) return delivered;
      for (const row of claimed) if (await this.sendOne(row)) delivered += 1;
    }
  }

  /** Wakes now (what a crash or a stop left queued) and every `everyMs`; the returned function stops it and waits for a send in progress. */
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

  async stop(): Promise<void> {
    this.stopped = true;
    await this.idle();
  }

  private async claim(): Promise<WebhookDelivery[]> {
    const now = this.clock.now();
    const repo = this.dataSource.getRepository(WebhookDelivery);
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
    const claimed: WebhookDelivery[] = [];
    for (const { id } of candidates) {
      const lease = token();
      const result = await repo
        .createQueryBuilder()
        .update(WebhookDelivery)
        .set({
          status: "sending",
          leaseToken: lease,
          leaseExpiresAt: new Date(now.getTime() + this.options.leaseMs),
          attempts: () => "attempts + 1",
        })
        .where("id = :id", { id })
        .andWhere(due)
        .execute();
      if (result.affected === 1) {
        const row = await repo.findOne({ where: { id, leaseToken: lease }, relations: { event: true, endpoint: true } });
        if (row) claimed.push(row);
      }
    }
    return claimed;
  }

  /** One attempt at one claimed delivery; true when the receiver answered 2xx. */
  private async sendOne(row: WebhookDelivery): Promise<boolean> {
    const repo = this.dataSource.getRepository(WebhookDelivery);
    const mine = { id: row.id, leaseToken: row.leaseToken! };
    const endpoint = row.endpoint as WebhookEndpoint;
    const event = row.event as WebhookEvent;
    const at = this.clock.now();
    if (!endpoint.active) {
      await this.record(row, at, null, "The endpoint is switched off.", 0);
      await repo.update(mine, { status: "failed", leaseToken: null, leaseExpiresAt: null, nextAttemptAt: null });
      return false;
    }
    const secrets = [endpoint.secret];
    if (endpoint.previousSecret && endpoint.previousSecretUntil && endpoint.previousSecretUntil.getTime() > at.getTime()) {
      secrets.push(endpoint.previousSecret);
    }
    const started = performance.now();
    let statusCode: number | null = null;
    let error: string | null = null;
    try {
      const res = await fetch(endpoint.url, {
        method: "POST",
        headers: {
          "Content-Type": "application/json",
          "User-Agent": "Dewline-Webhooks/1",
          [SIGNATURE_HEADER]: signatureHeader(secrets, at, event.body),
          [EVENT_ID_HEADER]: event.uid,
          [EVENT_TYPE_HEADER]: event.type,
          [ATTEMPT_HEADER]: String(row.attempts),
        },
        body: event.body,
        // A redirect is not followed (it could lead anywhere): it counts as a failed attempt.
        redirect: "manual",
        signal: AbortSignal.timeout(this.options.timeoutMs),
      });
      statusCode = res.status;
      // The answer's body is not needed; drop it rather than read an unbounded stream.
      await res.body?.cancel().catch(() => undefined);
      if (res.status < 200 || res.status > 299) error = `The receiver answered ${res.status}.`;
    } catch (e) {
      const err = e as Error & { cause?: { code?: string; message?: string } };
      error =
        err.name === "TimeoutError"
          ? `No answer within ${this.options.timeoutMs} ms.`
          : short(err.cause?.code ?? err.cause?.message ?? err.message ?? String(e));
    }
    const durationMs = Math.max(0, Math.round(performance.now() - started));
    await this.record(row, at, statusCode, error, durationMs);
    if (error === null) {
      // Delivered, whoever holds the lease now: a second copy would carry the same event id.
      await repo.update(row.id, {
        status: "delivered",
        deliveredAt: this.clock.now(),
        leaseToken: null,
        leaseExpiresAt: null,
        nextAttemptAt: null,
      });
      return true;
    }
    const last = row.attempts >= this.options.maxAttempts;
    this.logger.warn({ webhookDeliveryId: row.id, attempts: row.attempts, statusCode, err: error }, "webhook not delivered");
    await repo.update(mine, {
      status: last ? "failed" : "pending",
      leaseToken: null,
      leaseExpiresAt: null,
      nextAttemptAt: last ? null : new Date(this.clock.now().getTime() + webhookBackoffMs(row.attempts, this.options)),
    });
    return false;
  }

  private async record(row: WebhookDelivery, at: Date, statusCode: number | null, error: string | null, durationMs: number) {
    await this.dataSource
      .getRepository(WebhookAttempt)
      .insert({ deliveryId: row.id, attemptedAt: at, statusCode, error: error === null ? null : short(error), durationMs })
      // The endpoint (and with it the delivery) may have been removed during the call: nothing left to record on.
      .catch((e: unknown) => this.logger.debug({ err: e, webhookDeliveryId: row.id }, "webhook attempt not recorded"));
  }
}
