// Leases that let one app instance at a time run each named background job (the digest, the sweepers,
// the schedulers, the broker's files), held in MariaDB's `job_leases` table.
// - Taking a lease is one INSERT … ON DUPLICATE KEY UPDATE: it succeeds only when the lease is free or
//   has expired (its holder died or hung), and, for a repeating job, when the job is due cluster-wide.
//   Of two instances racing, one wins: a row lock on one server, a certification failure (deadlock
//   error) for the loser on Galera. MariaDB's GET_LOCK is not used: Galera does not replicate it.
// - Times are the database's (NOW(3)), never an instance's: instances' clocks differ, while every
//   instance asks the same database. The lease's length and the job's interval are durations only.
// - The holder renews while a run lasts; a dead holder's lease expires and another instance takes the
//   job over. A finished run gives the lease back at once, recording when it finished and any error.
import { randomBytes } from "node:crypto";
import type { DataSource } from "typeorm";
import { isRetryableTransactionError } from "./db-errors.js";
import type { Logger } from "./logger.js";

export interface JobLeaseSettings {
  /** Names this instance in the table and in the logs (INSTANCE_NAME). */
  holder: string;
  /** How long a lease lasts without renewal: the longest a dead holder keeps a job from the others. */
  leaseMs?: number;
}

export interface TakeOptions {
  /**
   * The job's interval: the instance that ran it last may run it again once 90% of this has passed
   * since its last start (timers drift a little); any other instance only after twice this, so the
   * job stays with one instance while it lives and moves when it does not.
   */
  everyMs?: number;
}

const MAX_ERROR = 1000;
export const DEFAULT_LEASE_MS = 60_000;

const newToken = () => randomBytes(16).toString("hex");
const us = (ms: number) => Math.max(0, Math.round(ms * 1000));

/** A lease this instance holds: renew it while the run lasts, release it when the run ends. */
export class JobLease {
  private lost = false;

  constructor(
    private readonly leases: JobLeases,
    readonly name: string,
    readonly token: string,
  ) {}

  /** Extends the lease; false when it is no longer ours (it expired and another instance took it). */
  async renew(): Promise<boolean> {
    if (this.lost) return false;
    const held = await this.leases.renew(this);
    if (!held) this.lost = true;
    return held;
  }

  /** Gives the lease back, recording the run's end and its error (null after a success). */
  release(error: unknown = null): Promise<void> {
    return this.leases.release(this, error);
  }
}

export class JobLeases {
  readonly holder: string;
  readonly leaseMs: number;

  constructor(
    private readonly dataSource: DataSource,
    settings: JobLeaseSettings,
    private readonly logger: Logger,
  ) {
    this.holder = settings.holder.slice(0, 100);
    this.leaseMs = settings.leaseMs ?? DEFAULT_LEASE_MS;
  }

  /**
   * Takes the named job's lease when it is free or expired (and, with `everyMs`, the job is due);
   * null when another instance holds it, the job is not due, or the database could not be asked.
   */
  async take(name: string, { everyMs }: TakeOptions = {}): Promise<JobLease | null> {
    const token = newToken();
    // Assignments run left to right: `token` is set first, from the old row, and every later one
    // follows it. Without `everyMs` (one-off work such as the broker's files) only the lease counts.
    const due =
      everyMs === undefined
        ? "TRUE"
        : `(last_started_at IS NULL OR last_started_at <= NOW(3) - INTERVAL IF(holder <=> VALUES(holder), ?, ?) MICROSECOND)`;
    const dueParams = everyMs === undefined ? [] : [us(everyMs * 0.9), us(everyMs * 2)];
    try {
      const rows: { token: string | null }[] = await this.dataSource.query(
        `INSERT INTO job_leases (name, holder, token, expires_at, last_started_at)
         VALUES (?, ?, ?, NOW(3) + INTERVAL ? MICROSECOND, NOW(3))
         ON DUPLICATE KEY UPDATE
           token = IF(expires_at <= NOW(3) AND ${due}, VALUES(token), token),
           holder = IF(token <=> VALUES(token), VALUES(holder), holder),
           expires_at = IF(token <=> VALUES(token), VALUES(expires_at), expires_at),
           last_started_at = IF(token <=> VALUES(token), VALUES(last_started_at), last_started_at)
         RETURNING token`,
        [name, this.holder, token, us(this.leaseMs), ...dueParams],
      );
      return rows[0]?.token === token ? new JobLease(this, name, token) : null;
    } catch (error) {
      // On Galera, two nodes granting the same lease at once: one commit fails certification (a
      // deadlock error). That one lost the race; it is not a fault.
      if (!isRetryableTransactionError(error)) {
        this.logger.warn(
          { err: error instanceof Error ? error.message : String(error), job: name },
          "could not ask for a job lease",
        );
      }
      return null;
    }
  }

  /** Takes the lease, asking again every `pollMs` while another instance holds it; null once `stillWanted` says stop. */
  async waitFor(name: string, { pollMs = 250, stillWanted = () => true }: { pollMs?: number; stillWanted?: () => boolean } = {}) {
    for (;;) {
      const lease = await this.take(name);
      if (lease || !stillWanted()) return lease;
      await new Promise((resolve) => setTimeout(resolve, pollMs));
    }
  }

  /** @internal through JobLease.renew() */
  async renew(lease: JobLease): Promise<boolean> {
    try {
      const result: { affectedRows?: number } = await this.dataSource.query(
        `UPDATE job_leases SET expires_at = NOW(3) + INTERVAL ? MICROSECOND WHERE name = ? AND token = ?`,
        [us(this.leaseMs), lease.name, lease.token],
      );
      const held = (result.affectedRows ?? 0) === 1;
      if (!held) this.logger.warn({ job: lease.name, holder: this.holder }, "a job's lease was lost while it ran");
      return held;
    } catch (error) {
      // Not known to be lost: the next renewal asks again (the lease may still be running out).
      this.logger.warn(
        { err: error instanceof Error ? error.message : String(error), job: lease.name },
        "could not renew a job lease",
      );
      return true;
    }
  }

  /** @internal through JobLease.release() */
  async release(lease: JobLease, error: unknown): Promise<void> {
    const message =
      error === null || error === undefined ? null : (error instanceof Error ? error.message : String(error)).slice(0, MAX_ERROR);
    try {
      await this.dataSource.query(
        `UPDATE job_leases SET token = NULL, expires_at = NOW(3), last_finished_at = NOW(3), last_error = ?
          WHERE name = ? AND token = ?`,
        [message, lease.name, lease.token],
      );
    } catch (err) {
      // The lease runs out by itself.
      this.logger.warn(
        { err: err instanceof Error ? err.message : String(err), job: lease.name },
        "could not release a job lease",
      );
    }
  }
}
