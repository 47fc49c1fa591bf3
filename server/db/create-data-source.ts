import "reflect-metadata";
import mysql from "mysql2";
import type MySQLStoreFactory from "express-mysql-session";
import { DataSource } from "typeorm";
import type { Config, DbTimeouts } from "../config/env.js";
import { DatabaseUnavailableError, isDatabaseUnavailable } from "../lib/db-errors.js";
import { attachDatabaseWatch, DatabaseWatch } from "../lib/database-watch.js";
import { hookTransactions } from "../lib/transaction.js";
import { entities } from "./entities.js";
import { migrations } from "./migrations.js";

type StoreConnection = ConstructorParameters<ReturnType<typeof MySQLStoreFactory>>[1];

export const DEFAULT_DB_TIMEOUTS: DbTimeouts = { connectMs: 1000, stallCheckMs: 400, queryMs: 30_000, acquireMs: 10_000 };

export function createDataSource(db: Config["db"]): DataSource {
  const timeouts = db.timeouts ?? DEFAULT_DB_TIMEOUTS;
  const dataSource = new DataSource({
    type: "mariadb",
    host: db.host,
    port: db.port,
    username: db.user,
    password: db.password,
    database: db.name,
    charset: "utf8mb4_unicode_ci",
    // Every DATETIME column holds UTC.
    timezone: "Z",
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    poolSize: 10,
    extra: { connectTimeout: timeouts.connectMs },
  });
  const prober = createProbe(db, timeouts.connectMs);
  const watch = new DatabaseWatch(prober.probe, {
    recheckMs: 250,
    freshMs: 250,
  });
  attachDatabaseWatch(dataSource, watch);
  // A request's Idempotency-Key is recorded inside its first transaction (server/middleware/idempotency.ts).
  hookTransactions(dataSource);
  // The pool TypeORM makes gets our timeouts and the watch (mysql2 has neither an acquire timeout
  // nor a way to tell a stalled server from a slow query).
  const driver = dataSource.driver as unknown as { createPool(options: unknown): Promise<mysql.Pool> };
  const createPool = driver.createPool.bind(driver);
  driver.createPool = async (options) => applySyncWait(guardPool(await createPool(options), watch, timeouts), db.syncWait);
  const destroy = dataSource.destroy.bind(dataSource);
  dataSource.destroy = async () => {
    watch.close();
    prober.close();
    await destroy();
  };
  return dataSource;
}

/**
 * On a Galera cluster, every pooled connection's session gets `wsrep_sync_wait` (DB_SYNC_WAIT): with
 * 1, a read waits until this node has applied every write the cluster committed before it, so a GET
 * after a POST that went to another node still sees it. Unset (a single MariaDB): nothing is sent.
 * Set the first time each connection is handed out (TypeORM takes one to check the pool before any
 * "connection" event could be heard); mysql2 runs a connection's statements in order, so the SET goes
 * before the caller's first query. If the SET fails, the connection is dropped: a query on it then
 * fails (503) rather than reading stale rows unnoticed.
 */
const SYNC_WAIT_SET = Symbol("syncWaitSet");

function applySyncWait(pool: mysql.Pool, syncWait: number | undefined): mysql.Pool {
  if (syncWait === undefined) return pool;
  const sql = `SET SESSION wsrep_sync_wait = ${Number(syncWait)}`;
  const getConnection = pool.getConnection.bind(pool);
  pool.getConnection = ((callback: (err: unknown, connection?: mysql.PoolConnection) => void) => {
    getConnection((err, connection) => {
      const c = connection as (mysql.PoolConnection & { [SYNC_WAIT_SET]?: true }) | undefined;
      if (!err && c && !c[SYNC_WAIT_SET]) {
        c[SYNC_WAIT_SET] = true;
        c.query(sql, (setErr) => {
          if (setErr) c.destroy();
        });
      }
      callback(err, connection);
    });
  }) as typeof pool.getConnection;
  return pool;
}

/**
 * Whether the server answers `SELECT 1` within `timeoutMs` (rejects if not), on a connection of the
 * probe's own kept open between probes: on a busy machine it is a fresh connection's handshake that is
 * slow, not the question, and a busy database is not a down one. After any failure the connection is
 * dropped; a kept connection that fails at once (the server closed it while idle) is replaced and asked
 * again within the same time.
 */
function createProbe(db: Config["db"], timeoutMs: number): { probe: () => Promise<void>; close: () => void } {
  let kept: mysql.Connection | null = null;
  const drop = (connection: mysql.Connection) => {
    if (kept === connection) kept = null;
    connection.destroy();
  };
  const ask = (deadline: number): Promise<void> =>
    new Promise<void>((resolve, reject) => {
      const reused = kept !== null;
      const connection =
        kept ??
        mysql.createConnection({
          host: db.host,
          port: db.port,
          user: db.user,
          password: db.password,
          database: db.name,
          connectTimeout: timeoutMs,
        });
      if (!reused) {
        connection.on("error", () => drop(connection));
        kept = connection;
      }
      const left = Math.max(1, deadline - Date.now());
      const timer = setTimeout(() => {
        drop(connection);
        reject(new DatabaseUnavailableError());
      }, left);
      connection.query({ sql: "SELECT 1", timeout: left }, (err) => {
        clearTimeout(timer);
        if (!err) return resolve();
        drop(connection);
        if (reused && Date.now() < deadline) ask(deadline).then(resolve, reject);
        else reject(err instanceof Error ? err : new Error(String(err)));
      });
    });
  return {
    probe: () => ask(Date.now() + timeoutMs),
    close: () => {
      if (kept) drop(kept);
    },
  };
}

const GUARDED = Symbol("dewline.guarded");
const TAINTED = Symbol("dewline.tainted");
type Callback = (err: unknown, ...rest: unknown[]) => void;
type GuardedConnection = mysql.PoolConnection & { [GUARDED]?: true; [TAINTED]?: boolean };

/**
 * - Waiting for a pooled connection is bounded (`acquireMs`), and ends at once when the database is
 *   known to be down or a probe finds it stalled.
 * - A query still unanswered after `stallCheckMs` asks the watch whether the server answers; if it
 *   does not, the query fails now with 503 (a slow query on a live server runs on, up to `queryMs`).
 *   COMMIT is the exception: its outcome would be unknown, so it waits for the answer (up to
 *   `queryMs`) rather than risk answering 503 for a write that then commits.
 * - A connection whose query failed that way is destroyed when released, never reused (its late
 *   answers would be read by the next query); the server rolls its open transaction back.
 */
function guardPool(pool: mysql.Pool, watch: DatabaseWatch, timeouts: DbTimeouts): mysql.Pool {
  const getConnection = pool.getConnection.bind(pool);
  pool.getConnection = ((callback: (err: unknown, connection?: mysql.PoolConnection) => void) => {
    if (watch.isDown) {
      process.nextTick(callback, new DatabaseUnavailableError());
      return;
    }
    let settled = false;
    const timers: NodeJS.Timeout[] = [];
    const finish = (err: unknown, connection?: mysql.PoolConnection) => {
      if (settled) {
        connection?.release();
        return;
      }
      settled = true;
      timers.forEach(clearTimeout);
      offDown();
      callback(err, connection);
    };
    const offDown = watch.onDown(() => finish(new DatabaseUnavailableError()));
    timers.push(
      setTimeout(() => {
        void watch.check().then((ok) => {
          if (!ok) finish(new DatabaseUnavailableError());
        });
      }, timeouts.stallCheckMs),
      setTimeout(
        () =>
          finish(
            new DatabaseUnavailableError("The service is busy right now: no database connection came free. Please try again.", 2),
          ),
        timeouts.acquireMs,
      ),
    );
    getConnection((err, connection) => {
      if (err) {
        if (isDatabaseUnavailable(err)) watch.suspect();
        finish(err);
        return;
      }
      finish(null, guardConnection(connection as GuardedConnection, watch, timeouts));
    });
  }) as typeof pool.getConnection;
  return pool;
}

function guardConnection(connection: GuardedConnection, watch: DatabaseWatch, timeouts: DbTimeouts): GuardedConnection {
  if (connection[GUARDED]) return connection;
  connection[GUARDED] = true;
  const query = connection.query.bind(connection) as (...args: unknown[]) => unknown;
  (connection as unknown as { query: unknown }).query = (...args: unknown[]) => {
    const last = args[args.length - 1];
    if (typeof last !== "function") return query(...args); // streams: left as they are
    const callback = last as Callback;
    if (connection[TAINTED] || watch.isDown) {
      connection[TAINTED] = true;
      process.nextTick(callback, new DatabaseUnavailableError());
      return undefined;
    }
    const sql = typeof args[0] === "string" ? args[0] : ((args[0] as { sql?: string } | undefined)?.sql ?? "");
    const isCommit = /^\s*COMMIT\b/i.test(sql);
    let settled = false;
    const timers: NodeJS.Timeout[] = [];
    const done: Callback = (err, ...rest) => {
      if (settled) return;
      settled = true;
      timers.forEach(clearTimeout);
      if (err && isDatabaseUnavailable(err)) {
        connection[TAINTED] = true;
        watch.suspect();
      }
      callback(err, ...rest);
    };
    if (!isCommit) {
      timers.push(
        setTimeout(() => {
          void watch.check().then((ok) => {
            if (!ok) done(new DatabaseUnavailableError());
          });
        }, timeouts.stallCheckMs),
      );
    }
    timers.push(setTimeout(() => done(new DatabaseUnavailableError()), timeouts.queryMs));
    return query(...args.slice(0, -1), done);
  };
  const release = connection.release.bind(connection);
  connection.release = () => {
    if (connection[TAINTED]) connection.destroy();
    else release();
  };
  return connection;
}

/**
 * What express-mysql-session needs of a connection (`query(sql, params)` resolving to `[rows, fields]`),
 * served by the app's DataSource, so sessions get the same timeouts and the same 503 while the
 * database is down, instead of a pool of their own that would hang on a stalled server.
 */
export function sessionStoreConnection(dataSource: DataSource): StoreConnection {
  const connection = {
    query: (sql: string, params?: unknown[]) => dataSource.query(sql, params).then((rows: unknown) => [rows, []]),
    end: () => Promise.resolve(),
  };
  return connection as unknown as StoreConnection;
}
