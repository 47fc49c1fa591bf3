// One transaction, run again from the start when MariaDB picks it as a deadlock victim or a lock wait times out.
import { AsyncLocalStorage } from "node:async_hooks";
import type { DataSource, EntityManager } from "typeorm";
import type { IsolationLevel } from "typeorm/driver/types/IsolationLevel.js";
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

/**
 * Something a request wants done at the start of each of its transactions: the idempotency key is
 * recorded this way (server/middleware/idempotency.ts), inside the write's own transaction, so the
 * write and the key commit together or not at all.
 */
export interface TransactionHook {
  /** Runs first inside the transaction; true when it wrote something the hook must hear the fate of. */
  begin(m: EntityManager): Promise<boolean>;
  committed(): void;
  rolledBack(): void;
}

const transactionHooks = new AsyncLocalStorage<TransactionHook>();

/** Runs `fn` (and everything it starts) with `hook` called by every transaction it opens. */
export function withTransactionHook<T>(hook: TransactionHook, fn: () => T): T {
  return transactionHooks.run(hook, fn);
}

type TransactionWork = (m: EntityManager) => Promise<unknown>;
type AnyTransaction = (isolation: IsolationLevel | TransactionWork | undefined, work?: TransactionWork) => Promise<unknown>;

/**
 * Makes `dataSource.transaction(…)` (and so `inTransaction`) call the current request's hook, if it
 * has one. Done on the DataSource's own manager rather than in `inTransaction` alone because many
 * services open their transactions with `dataSource.transaction` directly. Implicit transactions
 * (a lone `repository.save`) are not hooked: only a transaction a service opened on purpose carries
 * the key.
 */
export function hookTransactions(dataSource: DataSource): void {
  const manager = dataSource.manager;
  const original = manager.transaction.bind(manager) as AnyTransaction;
  const hooked: AnyTransaction = async (first, second) => {
    const hook = transactionHooks.getStore();
    const isolation = typeof first === "string" ? first : undefined;
    const work = (typeof first === "function" ? first : second) as TransactionWork;
    if (!hook) return original(isolation, work);
    let began = false;
    try {
      const result = await original(isolation, async (m) => {
        began = await hook.begin(m);
        return work(m);
      });
      if (began) hook.committed();
      return result;
    } catch (error) {
      if (began) hook.rolledBack();
      throw error;
    }
  };
  manager.transaction = hooked as EntityManager["transaction"];
}

/**
 * The same hook for a transaction opened by hand on a QueryRunner (a streaming import): call it right
 * after `startTransaction()`, inside the try that rolls back, and call the returned function with
 * whether the transaction committed.
 */
export async function beginHookedTransaction(m: EntityManager): Promise<(committed: boolean) => void> {
  const hook = transactionHooks.getStore();
  if (!hook || !(await hook.begin(m))) return () => undefined;
  return (committed) => (committed ? hook.committed() : hook.rolledBack());
}
