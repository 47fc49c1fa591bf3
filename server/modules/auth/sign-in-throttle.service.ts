import { createHash } from "node:crypto";
import type { DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { SignInThrottle } from "./sign-in-throttle.entity.js";

const FIRST_WAIT_S = 30;
const LONGEST_WAIT_S = 300;
/** Failures older than this are forgotten. */
const QUIET_MS = 24 * 3_600_000;
/** The owner is sent at most one unlock link in this time. */
const UNLOCK_MAIL_EVERY_MS = 3_600_000;

/** The wait asked after `failures` failures in a row: none before `threshold`, then 30 s doubling to 5 minutes. */
export function waitAfter(failures: number, threshold: number): number {
  if (failures < threshold) return 0;
  return Math.min(LONGEST_WAIT_S, FIRST_WAIT_S * 2 ** Math.min(failures - threshold, 16));
}

export const emailHash = (email: string) => createHash("sha256").update(email.trim().toLowerCase()).digest("hex");

/**
 * A growing wait between sign-in attempts per e-mail address (account or not), never a lock: the
 * worst an attacker can do is make each try wait five minutes, and the owner can skip the wait in
 * their own browser with an e-mailed link. Kept in MariaDB, so every app instance sees the same waits.
 */
export class SignInThrottleService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly threshold: number,
  ) {}

  /**
   * Claims this attempt: null when it may go ahead, else the seconds to wait. Once the threshold is
   * reached each allowed attempt at once sets the next wait, so parallel tries get one guess, not many.
   */
  async claim(email: string): Promise<number | null> {
    const hash = emailHash(email);
    const now = this.clock.now();
    return this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(SignInThrottle);
      const row = await repo.findOne({ where: { emailHash: hash }, lock: { mode: "pessimistic_write" } });
      if (!row || this.isQuiet(row, now)) return null;
      if (row.waitUntil && row.waitUntil > now) return Math.max(1, Math.ceil((row.waitUntil.getTime() - now.getTime()) / 1000));
      if (row.failures >= this.threshold) {
        await repo.update(hash, { waitUntil: new Date(now.getTime() + waitAfter(row.failures + 1, this.threshold) * 1000) });
      }
      return null;
    });
  }

  /** Counts a failure; true when the account's owner should now be sent an unlock link (at most one an hour). */
  async failed(email: string): Promise<{ notifyOwner: boolean }> {
    const hash = emailHash(email);
    const now = this.clock.now();
    return this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(SignInThrottle);
      const row = await repo.findOne({ where: { emailHash: hash }, lock: { mode: "pessimistic_write" } });
      const failures = (row && !this.isQuiet(row, now) ? row.failures : 0) + 1;
      const wait = waitAfter(failures, this.threshold);
      const notifyOwner = failures >= this.threshold && !this.mailedRecently(row, now);
      await repo.upsert(
        {
          emailHash: hash,
          failures,
          lastFailureAt: now,
          waitUntil: wait ? new Date(now.getTime() + wait * 1000) : null,
          unlockSentAt: notifyOwner ? now : (row?.unlockSentAt ?? null),
        },
        ["emailHash"],
      );
      return { notifyOwner };
    });
  }

  /** A successful sign-in forgets the failures. */
  async succeeded(email: string): Promise<void> {
    await this.dataSource.getRepository(SignInThrottle).delete({ emailHash: emailHash(email) });
  }

  /** Claims the right to e-mail an unlock link for this address now: false when one went out within the hour. */
  async claimUnlockMail(email: string): Promise<boolean> {
    const hash = emailHash(email);
    const now = this.clock.now();
    return this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(SignInThrottle);
      const row = await repo.findOne({ where: { emailHash: hash }, lock: { mode: "pessimistic_write" } });
      if (this.mailedRecently(row, now)) return false;
      if (row) await repo.update(hash, { unlockSentAt: now });
      else await repo.insert({ emailHash: hash, failures: 0, lastFailureAt: null, waitUntil: null, unlockSentAt: now });
      return true;
    });
  }

  private isQuiet(row: SignInThrottle, now: Date): boolean {
    return !row.lastFailureAt || now.getTime() - row.lastFailureAt.getTime() > QUIET_MS;
  }

  private mailedRecently(row: SignInThrottle | null, now: Date): boolean {
    return !!row?.unlockSentAt && now.getTime() - row.unlockSentAt.getTime() < UNLOCK_MAIL_EVERY_MS;
  }
}
