import { LRUCache } from "lru-cache";

const CHANGES_KEPT_MS = 60_000;

/**
 * A short-lived, bounded in-process copy of rows read on almost every request (a session, the account
 * behind it), so a burst of requests from one browser costs one database read, not one each.
 *
 * - Values live for `ttlMs` (0 turns the cache off): another process's change is seen within that time.
 * - This process's own changes are exact: `put` stores the new value, `forget` drops it, and a read that
 *   began before either can never put its older value back.
 * - `forget(key, holdOffMs)` also keeps the key out of the cache for a while: for a change made inside a
 *   transaction, which readers elsewhere cannot see until it commits.
 *
 * Values are kept as given: keep only immutable values (or strings) in it.
 */
export class RecentCache<K extends NonNullable<unknown>, V extends NonNullable<unknown>> {
  private readonly values: LRUCache<K, V> | null;
  /** When each key was last changed here, and until when it is kept out (ms, monotonic). */
  private readonly changed: LRUCache<K, { at: number; until: number }> | null;

  constructor(
    private readonly ttlMs: number,
    max = 10_000,
    private readonly now: () => number = () => performance.now(),
  ) {
    this.values = ttlMs > 0 ? new LRUCache<K, V>({ max, ttl: ttlMs, ttlResolution: 0, perf: { now } }) : null;
    // Remembered for longer than any read can take (queries time out well within a minute).
    this.changed =
      ttlMs > 0 ? new LRUCache({ max, ttl: Math.max(ttlMs, CHANGES_KEPT_MS), ttlResolution: 0, perf: { now } }) : null;
  }

  /** The cached value, or `load()`'s (cached when it is not null and nothing changed the key meanwhile). */
  async get(key: K, load: () => Promise<V | null | undefined>): Promise<V | null> {
    const cached = this.values?.get(key);
    if (cached !== undefined) return cached;
    const startedAt = this.now();
    const value = (await load()) ?? null;
    if (value !== null && this.values && this.changed) {
      const change = this.changed.get(key);
      if (!change || (change.at < startedAt && change.until <= this.now())) this.values.set(key, value);
    }
    return value;
  }

  /** This process has just written `value` (already committed): later reads get it. */
  put(key: K, value: V): void {
    if (!this.values || !this.changed) return;
    this.changed.set(key, { at: this.now(), until: this.now() });
    this.values.set(key, value);
  }

  /** This process changes or removes the key: read it from the database again, not before `holdOffMs` from now. */
  forget(key: K, holdOffMs = 0): void {
    if (!this.values || !this.changed) return;
    const now = this.now();
    this.values.delete(key);
    this.changed.set(key, { at: now, until: now + holdOffMs }, { ttl: Math.max(this.ttlMs, CHANGES_KEPT_MS, holdOffMs) });
  }
}
