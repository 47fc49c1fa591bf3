import type { Request, RequestHandler } from "express";
import type { Clock } from "../../lib/clock.js";

declare module "express-session" {
  interface SessionData {
    /** When the signed-in session was last written (ms, app clock): it is extended at most once a minute. */
    touchedAt?: number;
    /** Addresses (SHA-256) whose sign-in wait this browser may skip, from the owner's e-mailed link, with tries left. */
    signInUnlocks?: { emailHash: string; triesLeft: number }[];
  }
}

const TOUCH_EVERY_MS = 60_000;

/**
 * A signed-in session is written when it changes, and otherwise at most once a minute (to push its
 * expiry on): never an UPDATE per read. Mark the session written now (after sign-in).
 */
export const markTouched = (req: Request, clock: Clock) => {
  req.session.touchedAt = clock.now().getTime();
};

export function touchSessionsAtMostEveryMinute(clock: Clock): RequestHandler {
  return (req, _res, next) => {
    if (req.user) {
      const now = clock.now().getTime();
      const last = req.session.touchedAt;
      // Changing touchedAt makes express-session save the session (and its cookie's new expiry).
      if (last === undefined || now - last >= TOUCH_EVERY_MS || now < last) req.session.touchedAt = now;
    }
    next();
  };
}

/** Whether this browser holds an unused unlock for the address; `use` spends one of its tries. */
export function unlockedFor(req: Request, emailHash: string, use = false): boolean {
  const unlocks = req.session?.signInUnlocks ?? [];
  const unlock = unlocks.find((u) => u.emailHash === emailHash && u.triesLeft > 0);
  if (!unlock) return false;
  if (use) {
    unlock.triesLeft -= 1;
    req.session.signInUnlocks = unlocks.filter((u) => u.triesLeft > 0);
  }
  return true;
}

export function grantUnlock(req: Request, emailHash: string, tries: number): void {
  const others = (req.session.signInUnlocks ?? []).filter((u) => u.emailHash !== emailHash);
  req.session.signInUnlocks = [...others.slice(-4), { emailHash, triesLeft: tries }];
}
