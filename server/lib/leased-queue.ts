// A relay over a queue table (the e-mail outbox, webhook deliveries): it sends what the table holds,
// after the change that queued it has committed.
// - A due row (pending and its time has come, or claimed by a relay whose lease ran out because it died
//   or hung) is claimed with a lease (status "sending", a random token, an expiry) by a conditional
//   UPDATE, so two relays (two app instances) never send the same row at once, and a crash or a
//   restart loses nothing: whoever finds the lease expired takes the row over.
// - A failed attempt puts the row back to "pending" with a later `next_attempt_at` (doubling backoff);
//   after the last attempt it is "failed". What an attempt is, and what is kept of it, is the subclass's.
// - It never runs inside a request: `wake()` starts a drain in the background and returns at once.
import { randomBytes } from "node:crypto";
import {
  Brackets,
  type DataSource,
  type EntityTarget,
  type FindOptionsWhere,
  type QueryDeepPartialEntity,
  type Repository,
} from "typeorm";
import type { Clock } from "./clock.js";
import type { Logger } from "./logger.js";

export interface LeasedQueueOptions {
  /** Attempts before a row is given up as "failed". */
  maxAttempts: number;
  /** The first retry waits this long; each further one twice as long, up to `maxDelayMs`. */
  baseDelayMs: number;
  maxDelayMs: number;
  /** How long a claim lasts: longer than any one attempt can take with its timeouts. */
  leaseMs: number;
  /** Rows claimed per round. */
  batchSize: number;
}

/** The columns every leased queue table has. */
export interface LeasedRow {
  id: number;
  status: string;
  attempts: number;
  leaseToken: string | null;
  leaseExpiresAt: Date | null;
  nextAttemptAt: Date | null;
}

/** The wait before the next attempt, after `attempts` attempts have failed. */
export const backoffMs = (attempts: number, o: Pick<LeasedQueueOptions, "baseDelayMs" | "maxDelayMs">): number =>
  Math.min(o.maxDelayMs, o.baseDelayMs * 2 ** Math.max(0, Math.min(attempts - 1, 30)));

const token = () => randomBytes(12).toString("base64url");

export abstract class LeasedQueueRelay<Row extends LeasedRow> {
  private running: Promise<void> | null = null;
  private again = false;
  private stopped = false;

  protected constructor(
    protected readonly dataSource: DataSource,
    protected readonly logger: Logger,
    protected readonly clock: Clock,
    protected readonly queueOptions: LeasedQueueOptions,
    private readonly entity: EntityTarget<Row>,
    /** Names the relay in the log line when a round cannot run ("the mail relay"). */
    private readonly name: string,
  ) {}

  /** One attempt at one claimed row (its `attempts` already counts it); true when it was sent. */
  protected abstract sendOne(row: Row): Promise<boolean>;

  /** Columns set with the claim, besides the lease and the count of attempts. */
  protected claimColumns(_now: Date): QueryDeepPartialEntity<Row> {
    return {};
  }

  /** Reads a row this relay has just claimed. */
  protected loadClaimed(id: number, lease: string): Promise<Row | null> {
    return this.repo().findOneBy({ id, leaseToken: lease } as FindOptionsWhere<Row>);
  }

  protected repo(): Repository<Row> {
    return this.dataSource.getRepository(this.entity);
  }

  /** The lease's condition: an update under it changes nothing once another relay has taken the row over. */
  protected mine(row: Row): { id: number; leaseToken: string } {
    return { id: row.id, leaseToken: row.leaseToken! };
  }

  /** After a failed attempt: back to "pending" with the next attempt's time, or "failed" after the last. */
  protected afterFailure(row: Row) {
    const last = row.attempts >= this.queueOptions.maxAttempts;
    return {
      status: last ? ("failed" as const) : ("pending" as const),
      leaseToken: null,
      leaseExpiresAt: null,
      nextAttemptAt: last ? null : new Date(this.clock.now().getTime() + backoffMs(row.attempts, this.queueOptions)),
    };
  }

  /** Starts sending what is due, in the background (after a commit that queued a row). Never throws, never waits. */
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
        this.logger.warn({ err: error instanceof Error ? error.message : String(error) }, `${this.name} could not run`);
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
   * (each attempt is bounded by its timeouts).
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
  private async claim(): Promise<Row[]> {
    const now = this.clock.now();
    const repo = this.repo();
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
      .limit(this.queueOptions.batchSize)
      .getRawMany<{ id: number }>();
    const claimed: Row[] = [];
    for (const { id } of candidates) {
      const lease = token();
      // The same due condition again, in one statement: of two relays racing for a row, only one UPDATE matches.
      const result = await repo
        .createQueryBuilder()
        .update()
        .set({
          ...this.claimColumns(now),
          status: "sending",
          leaseToken: lease,
          leaseExpiresAt: new Date(now.getTime() + this.queueOptions.leaseMs),
          attempts: () => "attempts + 1",
        } as QueryDeepPartialEntity<Row>)
        .where("id = :id", { id })
        .andWhere(due)
        .execute();
      if (result.affected === 1) {
        const row = await this.loadClaimed(id, lease);
        if (row) claimed.push(row);
      }
    }
    return claimed;
  }
}
