import session, { type SessionData } from "express-session";
import { LRUCache } from "lru-cache";
import { RecentCache } from "../../lib/recent-cache.js";

/** The signed-in user's id in a session's data (a bare id in sessions from before session stamps). */
const userIdOf = (data: SessionData): number | null => {
  const user = (data as SessionData & { passport?: { user?: number | { id: number } } }).passport?.user;
  return typeof user === "number" ? user : (user?.id ?? null);
};

/**
 * The session store with a short-lived copy of each session in this process (server/lib/recent-cache.ts):
 * a page that fires several API calls reads its session row once. What this process writes or
 * destroys is exact at once; a session destroyed by another app instance is seen within `ttlMs`
 * (a password reset, a role change and disabling an account are exact everywhere: they raise the
 * account's session stamp, which the account read checks).
 */
export class CachedSessionStore extends session.Store {
  /** Kept as JSON: every request gets its own copy to change. */
  private readonly recent: RecentCache<string, string>;
  /** The sessions of each user this process has cached, so ending a user's sessions forgets them all. */
  private readonly sidsOfUser = new LRUCache<number, Set<string>>({ max: 10_000 });

  constructor(
    private readonly inner: session.Store,
    ttlMs: number,
  ) {
    super();
    this.recent = new RecentCache(ttlMs);
    // express-session watches its store's connection.
    for (const event of ["connect", "disconnect"]) inner.on(event, () => this.emit(event));
  }

  get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): void {
    this.recent
      .get(
        sid,
        () =>
          new Promise<string | null>((resolve, reject) =>
            this.inner.get(sid, (err, data) => (err ? reject(err as Error) : resolve(data ? JSON.stringify(data) : null))),
          ),
      )
      .then(
        (json) => {
          const data = json === null ? null : (JSON.parse(json) as SessionData);
          if (data) this.remember(sid, data);
          callback(null, data);
        },
        (err: unknown) => callback(err),
      );
  }

  /**
   * The user's sessions were ended in the database (UserService.endSessions, inside a transaction):
   * this process's copies go, and stay out for `holdOffMs` while that transaction commits.
   */
  forgetSessionsOf(userId: number, holdOffMs: number): void {
    for (const sid of this.sidsOfUser.get(userId) ?? []) this.recent.forget(sid, holdOffMs);
    this.sidsOfUser.delete(userId);
  }

  private remember(sid: string, data: SessionData): void {
    const userId = userIdOf(data);
    if (userId === null) return;
    const sids = this.sidsOfUser.get(userId) ?? new Set<string>();
    // Bounded: a user's oldest remembered sessions make way (they age out of the cache anyway).
    if (sids.size >= 50) sids.delete(sids.values().next().value!);
    this.sidsOfUser.set(userId, sids.add(sid));
  }

  set(sid: string, data: SessionData, callback?: (err?: unknown) => void): void {
    this.recent.forget(sid);
    this.inner.set(sid, data, (err) => {
      if (!err) {
        this.recent.put(sid, JSON.stringify(data));
        this.remember(sid, data);
      }
      callback?.(err);
    });
  }

  destroy(sid: string, callback?: (err?: unknown) => void): void {
    this.recent.forget(sid);
    this.inner.destroy(sid, (err) => {
      this.recent.forget(sid);
      callback?.(err);
    });
  }

  touch(sid: string, data: SessionData, callback?: () => void): void {
    if (this.inner.touch) this.inner.touch(sid, data, callback);
    else callback?.();
  }
}
