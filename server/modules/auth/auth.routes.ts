import { Router, type Request } from "express";
import {
  csrfResponse,
  invitationCreatedResponse,
  invitationDescriptionResponse,
  invitationSentResponse,
  loginResponse,
  meResponse,
  passwordResetRequestedResponse,
  signInUnlockRequestedResponse,
} from "../../../src/lib/contracts/auth.js";
import { shaped } from "../../lib/contract.js";
import { restamp } from "./passport.js";
import type { Config } from "../../config/env.js";
import type { Clock } from "../../lib/clock.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth, requireRole } from "../../middleware/auth.js";
import { bodyEmail, type RateLimits } from "../../middleware/rate-limit.js";
import { toMeDto } from "../users/user.mapper.js";
import { grantUnlock, markTouched, unlockedFor } from "./session.js";
import { emailHash } from "./sign-in-throttle.service.js";
import {
  acceptInvitationSchema,
  invitationSchema,
  loginSchema,
  passwordResetRequestSchema,
  passwordResetSchema,
  signInUnlockRequestSchema,
  signInUnlockSchema,
  tokenParamsSchema,
  userIdParamsSchema,
} from "./auth.schemas.js";
import type { AuthService, SessionActor } from "./auth.service.js";

interface Deps {
  config: Config;
  auth: AuthService;
  clock: Clock;
  csrfToken: (req: Request, overwrite?: boolean) => string;
  rateLimits: RateLimits;
}

const logIn = (req: Request, actor: SessionActor) =>
  new Promise<void>((resolve, reject) => req.logIn(actor, (err) => (err ? reject(err) : resolve())));
const saveSession = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
const logOut = (req: Request) => new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));

export function createAuthRouter({ config, auth, clock, csrfToken, rateLimits }: Deps): Router {
  const router = Router();
  // Per address: six times the per-account number of failures, so one person's mistakes (or a few
  // people's) behind a shared address never block the others; guessing across many accounts is
  // slowed. The owner of an account skips it with their e-mailed unlock link.
  const perAddress = rateLimits.limiter({
    name: "sign-in-address",
    windowMs: config.login.windowMs,
    limit: config.login.maxFailures * 6,
    failuresOnly: true,
    skip: (req) => unlockedFor(req, emailHash(bodyEmail(req))),
    message: "There have been many unsuccessful sign-ins from your network.",
    hint: 'If you need to sign in sooner, choose "E-mail me a link to skip the wait" and open the link in this browser.',
  });
  const resetLimit = rateLimits.limiter({
    name: "password-reset",
    windowMs: config.login.windowMs,
    limit: 10,
    message: "Too many password reset requests.",
  });
  const unlockLimit = rateLimits.limiter({
    name: "sign-in-link",
    windowMs: config.login.windowMs,
    limit: 10,
    message: "Too many requests for a sign-in link.",
  });

  router.get("/csrf", async (req, res) => {
    const before = req.session.csrfToken;
    const token = csrfToken(req);
    // A new token is good only once its session is stored: stored before answering, so a database
    // that is down is the usual 503 with Retry-After, not a token the next write is refused with.
    if (token !== before) await saveSession(req);
    res.json(shaped(csrfResponse, { csrfToken: token }));
  });

  router.post("/login", perAddress, async (req, res) => {
    const { email, password } = parse(loginSchema, req.body);
    const actor = await auth.signIn(email, password, unlockedFor(req, emailHash(email), true));
    // passport ≥ 0.6 regenerates the session here, so a pre-sign-in session id is never reused.
    await logIn(req, actor);
    markTouched(req, clock);
    res.json(shaped(loginResponse, { user: toMeDto(actor, await auth.languageOf(actor.id)), csrfToken: csrfToken(req, true) }));
  });

  /** Asks for a link that lets the account's owner skip the sign-in wait; the same answer for any address. */
  router.post("/sign-in-unlock/request", unlockLimit, (req, res) => {
    const { email } = parse(signInUnlockRequestSchema, req.body);
    auth.requestUnlockLink(email);
    res.status(202).json(
      shaped(signInUnlockRequestedResponse, {
        message: "If an active account uses that address, we have sent it a link. Open it in this browser, then sign in.",
      }),
    );
  });

  router.post("/sign-in-unlock", async (req, res) => {
    const { token } = parse(signInUnlockSchema, req.body);
    grantUnlock(req, await auth.useUnlockLink(token), config.login.maxFailures);
    res.status(204).end();
  });

  router.post("/logout", async (req, res) => {
    if (req.user) await logOut(req);
    res.status(204).end();
  });

  router.get("/me", requireAuth, async (req, res) => {
    const actor = actorOf(req);
    res.json(shaped(meResponse, toMeDto(actor, await auth.languageOf(actor.id))));
  });

  router.post("/invitations", requireRole("admin", "officer"), async (req, res) => {
    const input = parse(invitationSchema, req.body);
    const result = await auth.invite(actorOf(req), input);
    // The same answer whether or not the address already has an account with another landlord.
    res.status(201).json(shaped(invitationSentResponse, { expiresAt: result.expiresAt.toISOString() }));
  });

  router.post("/invitations/:userId/resend", requireRole("admin"), async (req, res) => {
    const { userId } = parse(userIdParamsSchema, req.params, "params");
    const result = await auth.resendInvitation(actorOf(req), userId);
    res.status(201).json(shaped(invitationCreatedResponse, { userId: result.userId, expiresAt: result.expiresAt.toISOString() }));
  });

  router.post("/invitations/:userId/cancel", requireRole("admin"), async (req, res) => {
    const { userId } = parse(userIdParamsSchema, req.params, "params");
    await auth.cancelInvitation(actorOf(req), userId);
    res.status(204).end();
  });

  router.get("/invitations/:token", async (req, res) => {
    const { token } = parse(tokenParamsSchema, req.params, "params");
    res.json(shaped(invitationDescriptionResponse, await auth.describeInvitation(token)));
  });

  router.post("/invitations/accept", async (req, res) => {
    const { token, password } = parse(acceptInvitationSchema, req.body);
    await auth.acceptInvitation(token, password);
    res.status(204).end();
  });

  router.post("/password-reset", resetLimit, (req, res) => {
    const { email } = parse(passwordResetRequestSchema, req.body);
    // Nothing is looked up before the reply: its timing is the same for any address.
    auth.requestPasswordReset(email);
    res.status(202).json(
      shaped(passwordResetRequestedResponse, {
        message: "If an active account uses that address, we have sent it a link to choose a new password.",
      }),
    );
  });

  router.post("/password-reset/confirm", async (req, res) => {
    const { token, password } = parse(passwordResetSchema, req.body);
    const { userId, sessionEpoch } = await auth.resetPassword(token, password, req.sessionID);
    // Every other session of the account has ended; this browser, if signed in as them, stays signed in.
    if (req.user?.id === userId) restamp(req, { ...req.user, sessionEpoch });
    res.status(204).end();
  });

  return router;
}
