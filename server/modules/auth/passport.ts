import passportLib from "passport";

export type Authenticator = InstanceType<typeof passportLib.Passport>;
import { Strategy as LocalStrategy } from "passport-local";
import type { AuthService } from "./auth.service.js";

/** A passport instance of this app's own (not the global singleton), so several apps can live in one process. */
export function createPassport(auth: AuthService): Authenticator {
  const passport = new passportLib.Passport();
  passport.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password", session: true }, (email, password, done) => {
      auth.verifyCredentials(email, password).then((actor) => done(null, actor ?? false), done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: number, done) => {
    auth.actorById(id).then((actor) => done(null, actor ?? false), done);
  });
  return passport;
}
