// Whether the database is known to be down, so requests fail fast with 503 instead of waiting on it.
import type { DataSource } from "typeorm";

export interface DatabaseWatchOptions {
  /** How often to try the database again while it is down. */
  recheckMs: number;
  /** How long a probe's answer holds before a new probe is made. */
  freshMs: number;
}

/**
 * Tells a stalled or stopped database from a slow query: a probe (a fresh connection and `SELECT 1`,
 * with its own short timeout) answers whether the server itself answers. While it does not, the
 * database is "down": new queries and connection requests fail at once with 503, and a probe runs
 * every `recheckMs` until it answers again ("up"), so the app recovers by itself.
 */
export class DatabaseWatch {
  private down = false;
  private since: Date | null = null;
  private probing: Promise<boolean> | null = null;
  private lastProbe = { at: 0, ok: true };
  private timer: NodeJS.Timeout | undefined;
  private closed = false;
  private readonly downListeners = new Set<() => void>();

  constructor(
    private readonly probe: () => Promise<void>,
    private readonly options: DatabaseWatchOptions,
  ) {}

  get isDown(): boolean {
    return this.down;
  }

  /** Since when the database has been down, or null. */
  get downSince(): Date | null {
    return this.since;
  }

  /** Whether the database answers now: one probe at a time, its answer reused for `freshMs`. */
  check(): Promise<boolean> {
    if (this.probing) return this.probing;
    if (Date.now() - this.lastProbe.at < this.options.freshMs) return Promise.resolve(this.lastProbe.ok);
    this.probing = this.probe().then(
      () => true,
      () => false,
    );
    return this.probing.then((ok) => {
      this.probing = null;
      this.lastProbe = { at: Date.now(), ok };
      if (ok) this.markUp();
      else this.markDown();
      return ok;
    });
  }

  /** A query failed as if the database were gone: probe now (not reusing an older answer). */
  suspect(): void {
    if (this.down || this.probing) return;
    this.lastProbe.at = 0;
    void this.check();
  }

  /** The database does not answer: fail fast from now on, and probe until it answers again. */
  markDown(): void {
    if (this.closed) return;
    if (!this.down) {
      this.down = true;
      this.since = new Date();
      for (const listener of [...this.downListeners]) listener();
    }
    this.schedule();
  }

  /** Runs `listener` each time the database goes down; returns the unsubscribe. */
  onDown(listener: () => void): () => void {
    this.downListeners.add(listener);
    return () => this.downListeners.delete(listener);
  }

  close(): void {
    this.closed = true;
    clearTimeout(this.timer);
  }

  private markUp(): void {
    this.down = false;
    this.since = null;
    clearTimeout(this.timer);
    this.timer = undefined;
  }

  private schedule(): void {
    if (this.timer || this.closed) return;
    this.timer = setTimeout(() => {
      this.timer = undefined;
      this.lastProbe.at = 0;
      void this.check().then((ok) => {
        if (!ok) this.schedule();
      });
    }, this.options.recheckMs);
    this.timer.unref();
  }
}

const watches = new WeakMap<DataSource, DatabaseWatch>();

export function attachDatabaseWatch(dataSource: DataSource, watch: DatabaseWatch): void {
  watches.set(dataSource, watch);
}

/** The watch of a DataSource made by createDataSource (undefined for any other). */
export function databaseWatchOf(dataSource: DataSource): DatabaseWatch | undefined {
  return watches.get(dataSource);
}
