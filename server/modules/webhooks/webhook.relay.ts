// The webhook relay: sends what webhook_deliveries holds, after the change that queued it has committed.
// The claim with a lease, the doubling backoff, the take-over of an expired lease and the background
// loop are the leased queue's (server/lib/leased-queue.ts), shared with the e-mail outbox relay; so
// two relays never send a row at once and a restart or a crash loses nothing. This is one attempt:
// - anything but a 2xx (no answer, a timeout, a redirect) is a failed attempt; after the last one the
//   delivery is "failed" and an admin can send it again;
// - every attempt is stored (time, status code or error, duration) for the admin to see.
// At-least-once: a crash between the receiver's 2xx and our UPDATE sends it again, with the same
// Dewline-Event-Id, which is what receivers de-duplicate by.
import { performance } from "node:perf_hooks";
import type { DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { LeasedQueueRelay, type LeasedQueueOptions } from "../../lib/leased-queue.js";
import type { Logger } from "../../lib/logger.js";
import { WebhookAttempt } from "./webhook-attempt.entity.js";
import { WebhookDelivery } from "./webhook-delivery.entity.js";
import { type WebhookEndpoint } from "./webhook-endpoint.entity.js";
import { type WebhookEvent } from "./webhook-event.entity.js";
import { ATTEMPT_HEADER, EVENT_ID_HEADER, EVENT_TYPE_HEADER, SIGNATURE_HEADER, signatureHeader } from "./webhook-signature.js";

export interface WebhookRelayOptions extends LeasedQueueOptions {
  /** Each HTTP call's limit (connect, send, answer), through AbortSignal.timeout. */
  timeoutMs: number;
}

export const DEFAULT_WEBHOOK_RELAY_OPTIONS: WebhookRelayOptions = {
  maxAttempts: 12,
  baseDelayMs: 30_000,
  maxDelayMs: 3_600_000,
  timeoutMs: 10_000,
  leaseMs: 60_000,
  batchSize: 10,
};

const short = (text: string) => text.slice(0, 500);

export class WebhookRelay extends LeasedQueueRelay<WebhookDelivery> {
  private readonly timeoutMs: number;

  constructor(dataSource: DataSource, logger: Logger, clock: Clock, options: Partial<WebhookRelayOptions> = {}) {
    const { timeoutMs, ...queue } = { ...DEFAULT_WEBHOOK_RELAY_OPTIONS, ...options };
    super(dataSource, logger, clock, queue, WebhookDelivery, "the webhook relay");
    this.timeoutMs = timeoutMs;
  }

  protected override loadClaimed(id: number, lease: string): Promise<WebhookDelivery | null> {
    return this.repo().findOne({ where: { id, leaseToken: lease }, relations: { event: true, endpoint: true } });
  }

  /** One attempt at one claimed delivery; true when the receiver answered 2xx. */
  protected async sendOne(row: WebhookDelivery): Promise<boolean> {
    const repo = this.repo();
    const mine = this.mine(row);
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
        signal: AbortSignal.timeout(this.timeoutMs),
      });
      statusCode = res.status;
      // The answer's body is not needed; drop it rather than read an unbounded stream.
      await res.body?.cancel().catch(() => undefined);
      if (res.status < 200 || res.status > 299) error = `The receiver answered ${res.status}.`;
    } catch (e) {
      const err = e as Error & { cause?: { code?: string; message?: string } };
      error =
        err.name === "TimeoutError"
          ? `No answer within ${this.timeoutMs} ms.`
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
    this.logger.warn({ webhookDeliveryId: row.id, attempts: row.attempts, statusCode, err: error }, "webhook not delivered");
    await repo.update(mine, this.afterFailure(row));
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
