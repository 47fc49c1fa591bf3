// The stored Idempotency-Keys: claimed inside the caller's own write transaction, answered once the
// reply is known, found again by a retry, and purged after a day.
import type { DataSource, EntityManager } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { AppError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { IdempotencyKey } from "./idempotency-key.entity.js";

/** How long a key is remembered: a retry after a failover comes within minutes, a day is ample. */
export const IDEMPOTENCY_KEY_TTL_MS = 24 * 3_600_000;
/** The purge runs at most this often per process, after an answer is stored. */
const PURGE_EVERY_MS = 10 * 60_000;
const PURGE_BATCH = 1000;

/** Whose keys these are: one user's, or one integration API key's. Two scopes never share a key. */
export interface IdempotencyScope {
  kind: "user" | "api_key";
  id: number;
  organisationId: number;
}

/** What the request was: a reuse of the key for anything else is refused. */
export interface RequestPrint {
  method: string;
  path: string;
  hash: string;
}

/**
 * Another request with the same key committed its write first (the unique index said so). Thrown
 * inside the second request's transaction, which rolls back: the idempotency middleware then
 * answers with the first request's answer. The 409 is only what a caller sees if nothing catches it.
 */
export class IdempotencyKeyTakenError extends AppError {
  constructor() {
    super(409, "already_applied", "This request was already carried out. Refresh to see the result.");
  }
}

const isDuplicateEntry = (err: unknown): boolean => {
  const e = (err ?? {}) as { code?: unknown; errno?: unknown; driverError?: { code?: unknown; errno?: unknown } };
  const d = e.driverError ?? e;
  return d.errno === 1062 || d.code === "ER_DUP_ENTRY";
};

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export class IdempotencyService {
  private lastPurge = 0;

  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly logger: Logger,
  ) {}

  /** The key's row if it is still remembered; one older than a day is deleted and treated as new. */
  async find(scope: IdempotencyScope, key: string): Promise<IdempotencyKey | null> {
    const repo = this.dataSource.getRepository(IdempotencyKey);
    const row = await repo.findOneBy({ scopeKind: scope.kind, scopeId: scope.id, key });
    if (!row) return null;
    if (row.createdAt.getTime() > this.clock.now().getTime() - IDEMPOTENCY_KEY_TTL_MS) return row;
    await repo.delete({ id: row.id });
    return null;
  }

  /**
   * Records the key in the caller's transaction `m`. When another request holds the same key
   * uncommitted, MariaDB makes this insert wait for it: if it commits, this throws
   * IdempotencyKeyTakenError (and the caller's transaction rolls back); if it rolls back, this succeeds.
   */
  async claim(m: EntityManager, scope: IdempotencyScope, key: string, print: RequestPrint): Promise<void> {
    try {
      await m.insert(IdempotencyKey, {
        scopeKind: scope.kind,
        scopeId: scope.id,
        organisationId: scope.organisationId,
        key,
        method: print.method,
        path: print.path,
        requestHash: print.hash,
        responseStatus: null,
        responseBody: null,
        bodyWithheld: false,
        createdAt: this.clock.now(),
        respondedAt: null,
      });
    } catch (error) {
      if (isDuplicateEntry(error)) throw new IdempotencyKeyTakenError();
      throw error;
    }
  }

  /** The first request's answer, for later retries; `body` null when withheld or there was none. */
  async storeAnswer(scope: IdempotencyScope, key: string, status: number, body: string | null, withheld: boolean): Promise<void> {
    await this.dataSource
      .getRepository(IdempotencyKey)
      .update(
        { scopeKind: scope.kind, scopeId: scope.id, key },
        { responseStatus: status, responseBody: body, bodyWithheld: withheld, respondedAt: this.clock.now() },
      );
    void this.purgeNowAndThen();
  }

  /**
   * The key's row once it has an answer, looking again every 50 ms for up to `waitMs` while the
   * first request (committed, still replying) has not stored it yet. Null when no row is found.
   */
  async waitForAnswer(scope: IdempotencyScope, key: string, waitMs: number): Promise<IdempotencyKey | null> {
    const deadline = performance.now() + waitMs;
    for (;;) {
      const row = await this.find(scope, key);
      if (!row || row.responseStatus !== null || performance.now() >= deadline) return row;
      await sleep(50);
    }
  }

  /** Deletes keys older than a day, a batch at a time; also called by tests. */
  async purgeExpired(): Promise<number> {
    const cutoff = new Date(this.clock.now().getTime() - IDEMPOTENCY_KEY_TTL_MS);
    const result: { affectedRows?: number } = await this.dataSource.query(
      "DELETE FROM `idempotency_keys` WHERE `created_at` < ? ORDER BY `created_at` LIMIT ?",
      [cutoff, PURGE_BATCH],
    );
    return result.affectedRows ?? 0;
  }

  // On the request path rather than in a repeating job: it is one small indexed delete every ten
  // minutes per instance, and needs no job of its own to be started, stopped and tested.
  private async purgeNowAndThen(): Promise<void> {
    const now = this.clock.now().getTime();
    if (now - this.lastPurge < PURGE_EVERY_MS) return;
    this.lastPurge = now;
    await this.purgeExpired().catch((err: unknown) => this.logger.warn({ err }, "old idempotency keys could not be purged"));
  }
}
