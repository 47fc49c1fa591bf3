// A cost-based budget per caller: each key holds up to `perMinute` readings, spent by each request's
// reading count and refilled continuously at perMinute a minute (a token bucket). One 100 000-reading
// series costs as much as a thousand 100-reading ones, which a count of requests cannot see.
import type { Clock } from "../../lib/clock.js";

const MINUTE_MS = 60_000;
/** Buckets left untouched this long are full again, so they are dropped (bounded memory). */
const SWEEP_EVERY = 1_000;

interface Bucket {
  tokens: number;
  atMs: number;
}

export class ReadingBudget {
  private readonly buckets = new Map<string, Bucket>();
  private calls = 0;

  constructor(
    private readonly perMinute: number,
    private readonly clock: Clock,
  ) {}

  /** Spends `cost` readings of `key`'s budget; when they are not there, spends nothing and says when they will be. */
  take(key: string, cost: number): { ok: true } | { ok: false; retryAfterSeconds: number } {
    const now = this.clock.now().getTime();
    if (++this.calls % SWEEP_EVERY === 0) this.sweep(now);
    const bucket = this.refilled(this.buckets.get(key), now);
    // A request larger than the whole budget would never fit; it is refused by the size limit first.
    const needed = Math.min(cost, this.perMinute);
    if (bucket.tokens >= needed) {
      bucket.tokens -= needed;
      this.buckets.set(key, bucket);
      return { ok: true };
    }
    this.buckets.set(key, bucket);
    const waitMs = ((needed - bucket.tokens) * MINUTE_MS) / this.perMinute;
    return { ok: false, retryAfterSeconds: Math.max(1, Math.ceil(waitMs / 1000)) };
  }

  /**
   * Spends `cost` readings whether or not they are there (a negative cost gives readings back): the
   * bucket may go below zero, and the key then waits until it has refilled past zero. For the part of a
   * request found only once it was let in.
   */
  charge(key: string, cost: number): void {
    if (cost === 0) return;
    const bucket = this.refilled(this.buckets.get(key), this.clock.now().getTime());
    bucket.tokens = Math.min(this.perMinute, bucket.tokens - cost);
    this.buckets.set(key, bucket);
  }

  /** How many readings `key` may have evaluated now (never below zero). */
  available(key: string): number {
    return Math.max(0, Math.floor(this.refilled(this.buckets.get(key), this.clock.now().getTime()).tokens));
  }

  /** Whether `cost` readings are there now, spending nothing (to refuse a request before reading its body). */
  has(key: string, cost: number): { ok: true } | { ok: false; retryAfterSeconds: number } {
    const bucket = this.refilled(this.buckets.get(key), this.clock.now().getTime());
    const needed = Math.min(cost, this.perMinute);
    if (bucket.tokens >= needed) return { ok: true };
    const waitMs = ((needed - bucket.tokens) * MINUTE_MS) / this.perMinute;
    return { ok: false, retryAfterSeconds: Math.max(1, Math.ceil(waitMs / 1000)) };
  }

  private refilled(bucket: Bucket | undefined, now: number): Bucket {
    if (!bucket) return { tokens: this.perMinute, atMs: now };
    const elapsed = Math.max(0, now - bucket.atMs);
    return { tokens: Math.min(this.perMinute, bucket.tokens + (elapsed * this.perMinute) / MINUTE_MS), atMs: now };
  }

  private sweep(now: number): void {
    // Only a bucket that has certainly refilled is dropped (one in debt takes longer).
    for (const [key, bucket] of this.buckets)
      if (now - bucket.atMs >= MINUTE_MS * (1 + Math.max(0, -bucket.tokens) / this.perMinute)) this.buckets.delete(key);
  }
}
