import { createHash } from "node:crypto";
import type { DataSource } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { inTransaction } from "../../lib/transaction.js";
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
    return inTransaction(this.dataSource, async (m) => {
      const repo = m.getRepository(SignInThrottle);
      const row = await repo.findOne({ where: { emailHash: hash }, lock: { mode: "pessimistic_write" } });
      if (!row || this.isQuiet(row, now)) return null;
      if (row.waitUntil && row.waitUntil > now) return Math.max(1, Math.ceil((row.waitUntil.getTime() - now.getTime()) / 1000));
      if (row.failures >= this.threshold) {
        const waitUntil = new Date(now.getTime() + waitAfter(row.failures + 1, this.threshold) * 1000);
        // Only while no wait is running: of two tries at once, where the row lock does not reach
        // (another Galera node), the one that sets the wait goes ahead and the other is asked to wait.
        const set = await repo
          .createQueryBuilder()
          .update()
          .set({ waitUntil })
          .where("email_hash = :hash AND (wait_until IS NULL OR wait_until <= :now)", { hash, now })
          .execute();
        if (!set.affected) return Math.max(1, Math.ceil((waitUntil.getTime() - now.getTime()) / 1000));
      }
      return null;
    });
  }

  /**
   * Counts a failure; true when the account's owner should now be sent an unlock link (at most one an
   * hour). The count goes up in SQL (`failures + 1`, or 1 once the failures are forgotten), so two
   * failures at once count two even where a row lock does not reach (another Galera node); the wait
   * and the unlock link are then decided from the row as this transaction left it.
   */
  async failed(email: string): Promise<{ notifyOwner: boolean }> {
    const hash = emailHash(email);
    const now = this.clock.now();
    const quietSince = new Date(now.getTime() - QUIET_MS);
    return inTransaction(this.dataSource, async (m) => {
      await m.query(
        "INSERT INTO sign_in_throttles (email_hash, failures, last_failure_at, wait_until, unlock_sent_at) VALUES (?, 1, ?, NULL, NULL) " +
          "ON DUPLICATE KEY UPDATE failures = IF(last_failure_at IS NULL OR last_failure_at < ?, 1, failures + 1), last_failure_at = VALUES(last_failure_at)",
        [hash, now, quietSince],
      );
      const row = await m.getRepository(SignInThrottle).findOneByOrFail({ emailHash: hash });
      const wait = waitAfter(row.failures, this.threshold);
      const notifyOwner = row.failures >= this.threshold && !this.mailedRecently(row, now);
      await m.getRepository(SignInThrottle).update(hash, {
        waitUntil: wait ? new Date(now.getTime() + wait * 1000) : null,
        ...(notifyOwner ? { unlockSentAt: now } : {}),
      });
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
