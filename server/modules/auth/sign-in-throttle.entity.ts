import { Column, Entity, PrimaryColumn } from "typeorm";

/**
 * Unsuccessful sign-ins per e-mail address, whether or not an account uses it (so the answers never
 * tell which addresses have one). Only the address's SHA-256 is kept. Written only by SignInThrottleService.
 */
@Entity({ name: "sign_in_throttles" })
export class SignInThrottle {
  @PrimaryColumn({ name: "email_hash", type: "char", length: 64 })
  emailHash: string;

  /** Failures in a row since the last successful sign-in (or the last quiet day). */
  @Column({ type: "int", unsigned: true, default: 0 })
  failures: number;

  @Column({ name: "last_failure_at", type: "datetime", precision: 3, nullable: true })
  lastFailureAt: Date | null;

  /** No attempt is checked before this instant; null when no wait is asked. */
  @Column({ name: "wait_until", type: "datetime", precision: 3, nullable: true })
  waitUntil: Date | null;

  /** When the account's owner was last sent an unlock link (at most one an hour). */
  @Column({ name: "unlock_sent_at", type: "datetime", precision: 3, nullable: true })
  unlockSentAt: Date | null;
}
