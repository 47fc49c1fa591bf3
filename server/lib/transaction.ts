// One transaction, run again from the start when MariaDB picks it as a deadlock victim or a lock wait times out.
import type { DataSource, EntityManager } from "typeorm";
import { isRetryableTransactionError } from "./db-errors.js";

export interface RetryOptions {
  /** Runs in all, the first included. */
  attempts?: number;
  /** The first backoff's upper bound; each later one doubles. Each wait is jittered between half and all of it. */
  baseDelayMs?: number;
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * `dataSource.transaction(work)`, retried as a whole on ER_LOCK_DEADLOCK (1213) and
 * ER_LOCK_WAIT_TIMEOUT (1205): MariaDB has rolled the transaction back (or we roll it back), so
 * running `work` again is safe as long as `work` does nothing but database work in `m` (side effects
 * such as sending mail go after commit: return them). Any other error, and the last retryable one,
 * goes to the caller.
 */
export async function inTransaction<T>(
  dataSource: DataSource,
  work: (m: EntityManager) => Promise<T>,
  { attempts = 4, baseDelayMs = 15 }: RetryOptions = {},
): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await dataSource.transaction(work);
    } catch (err) {
      if (attempt >= attempts || !isRetryableTransactionError(err)) throw err;
      const cap = baseDelayMs * 2 ** (attempt - 1);
      await sleep(cap / 2 + Math.random() * (cap / 2));
    }
  }
}
