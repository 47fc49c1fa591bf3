// express-rate-limit's counts kept in MariaDB (`rate_limit_hits`), so every app instance counts the
// same hits: ten sign-in failures spread over two instances are ten, not five and five.
// - A hit is one INSERT … ON DUPLICATE KEY UPDATE … RETURNING: a key's window starts at its first hit
//   and lasts `windowMs`; a hit after the window starts a new one at 1. Times are the database's
//   (NOW(3)), never an instance's, since instances' clocks differ.
// - When the database cannot be asked, the limiter lets the request through (logged): refusing every
//   request because the counter is away would turn a database fault into a full outage, and the
//   routes behind a limit need the database anyway.
// - Expired rows are deleted by purgeExpiredRateLimitHits (a background job under a lease).
import { createHash } from "node:crypto";
import type { DataSource } from "typeorm";
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from "express-rate-limit";

const MAX_KEY = 255;
const us = (ms: number) => Math.max(0, Math.round(ms * 1000));

/** The stored key: the limiter's prefix and the client's key, hashed when too long for the column. */
function storedKey(prefix: string, key: string): string {
  const full = `${prefix}${key}`;
  return full.length <= MAX_KEY ? full : `${prefix}#${createHash("sha256").update(key).digest("hex")}`.slice(0, MAX_KEY);
}

export class DatabaseRateLimitStore implements Store {
  /** Counts here are seen by every instance: express-rate-limit's double-count check knows by this. */
  readonly localKeys = false;
  private windowMs = 60_000;

  /**
   * `prefix` names the limiter (and, in tests, the app): two limiters counting the same client
   * (an address, say) keep separate counts.
   */
  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: { hits: number; ms: number }[] = await this.dataSource.query(
      `SELECT hits, TIMESTAMPDIFF(MICROSECOND, NOW(3), reset_at) DIV 1000 AS ms FROM rate_limit_hits
        WHERE hit_key = ? AND reset_at > NOW(3)`,
      [storedKey(this.prefix, key)],
    );
    const row = rows[0];
    return row ? { totalHits: Number(row.hits), resetTime: this.resetTime(row.ms) } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    // `hits` is assigned before `reset_at`, so both read the old `reset_at`.
    const rows: { hits: number; ms: number }[] = await this.dataSource.query(
      `INSERT INTO rate_limit_hits (hit_key, hits, reset_at) VALUES (?, 1, NOW(3) + INTERVAL ? MICROSECOND)
       ON DUPLICATE KEY UPDATE
         hits = IF(reset_at <= NOW(3), 1, hits + 1),
         reset_at = IF(reset_at <= NOW(3), VALUES(reset_at), reset_at)
       RETURNING hits, TIMESTAMPDIFF(MICROSECOND, NOW(3), reset_at) DIV 1000 AS ms`,
      [storedKey(this.prefix, key), us(this.windowMs)],
    );
    const row = rows[0]!;
    return { totalHits: Number(row.hits), resetTime: this.resetTime(row.ms) };
  }

  async decrement(key: string): Promise<void> {
    await this.dataSource.query(
      `UPDATE rate_limit_hits SET hits = GREATEST(hits, 1) - 1 WHERE hit_key = ? AND reset_at > NOW(3)`,
      [storedKey(this.prefix, key)],
    );
  }

  async resetKey(key: string): Promise<void> {
    await this.dataSource.query(`DELETE FROM rate_limit_hits WHERE hit_key = ?`, [storedKey(this.prefix, key)]);
  }

  /** The window's end on this instance's clock, from the time left that the database measured. */
  private resetTime(msLeft: number): Date {
    return new Date(Date.now() + Math.max(0, Number(msLeft)));
  }
}

/** Deletes up to `batch` rows whose window has ended (with a minute's grace); returns how many went. */
export async function purgeExpiredRateLimitHits(dataSource: DataSource, batch = 5000): Promise<number> {
  const result: { affectedRows?: number } = await dataSource.query(
    `DELETE FROM rate_limit_hits WHERE reset_at < NOW(3) - INTERVAL 1 MINUTE ORDER BY reset_at LIMIT ?`,
    [batch],
  );
  return result.affectedRows ?? 0;
}
