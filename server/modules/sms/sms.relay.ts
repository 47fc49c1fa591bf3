// The text relay: sends what the text outbox holds, after the change that queued it has committed.
// The claim with a lease, the backoff and the background loop are the leased queue's
// (server/lib/leased-queue.ts); this is what one attempt at one text is. Every attempt carries the
// row's own reference (`outbox-sms-<id>`), so a text sent twice after a crash can be told apart.
import type { DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { LeasedQueueRelay, type LeasedQueueOptions } from "../../lib/leased-queue.js";
import type { Logger } from "../../lib/logger.js";
import { OutboxSms } from "./outbox-sms.entity.js";
import type { SmsProvider } from "./sms-provider.js";

export const DEFAULT_SMS_RELAY_OPTIONS: LeasedQueueOptions = {
  maxAttempts: 12,
  baseDelayMs: 30_000,
  maxDelayMs: 3_600_000,
  leaseMs: 2 * 60_000,
  batchSize: 10,
};

export class SmsRelay extends LeasedQueueRelay<OutboxSms> {
  constructor(
    dataSource: DataSource,
    private readonly provider: SmsProvider,
    logger: Logger,
    clock: Clock,
    options: Partial<LeasedQueueOptions> = {},
  ) {
    super(dataSource, logger, clock, { ...DEFAULT_SMS_RELAY_OPTIONS, ...options }, OutboxSms, "the text relay");
  }

  protected override claimColumns(now: Date) {
    return { lastAttemptAt: now };
  }

  protected async sendOne(row: OutboxSms): Promise<boolean> {
    const repo = this.repo();
    const result = await this.provider.send(row.toNumber, row.body, `outbox-sms-${row.id}`);
    if (!result.ok) {
      this.logger.warn({ outboxSmsId: row.id, attempts: row.attempts, err: result.error }, "text could not be sent");
      // A refusal that will not mend (a bad number, key or template) fails at once; the rest wait and retry.
      const after = result.retry
        ? this.afterFailure(row)
        : { status: "failed" as const, leaseToken: null, leaseExpiresAt: null, nextAttemptAt: null };
      await repo.update(this.mine(row), { ...after, error: result.error });
      return false;
    }
    await repo.update(row.id, {
      status: "sent",
      providerId: result.providerId,
      sentAt: this.clock.now(),
      error: null,
      leaseToken: null,
      leaseExpiresAt: null,
      nextAttemptAt: null,
    });
    return true;
  }
}
