// Whether a caller of the public calculator is signed in, without making the calculator depend on
// the session store. The session cookie is read through express-session with a read-only view of
// the store: a lookup that fails or takes longer than LOOKUP_TIMEOUT_MS counts as anonymous (the
// smaller limits apply), and nothing is ever written (no new session, no touch, no cookie).
import type { RequestHandler } from "express";
import session from "express-session";

const LOOKUP_TIMEOUT_MS = 250;

class ReadOnlyStore extends session.Store {
  constructor(private readonly inner: session.Store) {
    super();
  }

  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
    let done = false;
    const finish = (data: session.SessionData | null) => {
      if (done) return;
      done = true;
      clearTimeout(timer);
      callback(null, data);
    };
    const timer = setTimeout(() => finish(null), LOOKUP_TIMEOUT_MS);
    try {
      this.inner.get(sid, (err, data) => finish(err ? null : (data ?? null)));
    } catch {
      finish(null);
    }
  }

  override set(_sid: string, _session: session.SessionData, callback?: (err?: unknown) => void): void {
    callback?.();
  }

  override destroy(_sid: string, callback?: (err?: unknown) => void): void {
    callback?.();
  }

  override touch(_sid: string, _session: session.SessionData, callback?: () => void): void {
    callback?.();
  }
}

/** Sets res.locals.signedIn: true when the request carries the cookie of a live signed-in session. */
export function recogniseSignedIn(options: { store: session.Store; secret: string; cookieName: string }): RequestHandler {
  const read = session({
    name: options.cookieName,
    secret: options.secret,
    store: new ReadOnlyStore(options.store),
    resave: false,
    saveUninitialized: false,
    rolling: false,
  });
  return (req, res, next) => {
    read(req, res, (err?: unknown) => {
      const passport = (req.session as { passport?: { user?: unknown } } | undefined)?.passport;
      res.locals.signedIn = !err && passport?.user !== undefined && passport.user !== null;
      next();
    });
  };
}
