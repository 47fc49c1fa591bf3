import passportLib from "passport";
import type { Request } from "express";
import type { AuthService, SessionActor } from "./auth.service.js";

export type Authenticator = InstanceType<typeof passportLib.Passport>;

/** What a session keeps of its user: the id and the account's session stamp at sign-in. */
interface SessionStamp {
  id: number;
  epoch: number;
}

const stampOf = (actor: SessionActor): SessionStamp => ({ id: actor.id, epoch: actor.sessionEpoch });

/**
 * A passport instance of this app's own (not the global singleton), so several apps can live in one
 * process. Passwords are checked by AuthService.signIn (with its waits); passport keeps the session.
 */
export function createPassport(auth: AuthService): Authenticator {
  const passport = new passportLib.Passport();
  passport.serializeUser((user, done) => done(null, stampOf(user as SessionActor)));
  passport.deserializeUser((stamp: SessionStamp | number, done) => {
    // A bare id is a session from before stamps: it counts as stamp 0.
    const { id, epoch } = typeof stamp === "number" ? { id: stamp, epoch: 0 } : stamp;
    auth.actorForSession(id, epoch).then((actor) => done(null, actor ?? false), done);
  });
  return passport;
}

/** Gives the signed-in session the account's new stamp (the browser that made a password reset stays signed in). */
export function restamp(req: Request, actor: SessionActor): void {
  const session = req.session as typeof req.session & { passport?: { user?: SessionStamp } };
  if (session.passport) session.passport.user = stampOf(actor);
}
