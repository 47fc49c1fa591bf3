import { Router, type Request } from "express";
import {
  csrfResponse,
  invitationCreatedResponse,
  invitationDescriptionResponse,
  loginResponse,
  passwordResetRequestedResponse,
} from "../../../src/lib/contracts/auth.js";
import { shaped } from "../../lib/contract.js";
import type { Authenticator } from "./passport.js";
import type { Config } from "../../config/env.js";
import { AppError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth, requireRole } from "../../middleware/auth.js";
import { accountKey, limiter } from "../../middleware/rate-limit.js";
import { toMeDto } from "../users/user.mapper.js";
import type { Actor } from "./actor.js";
import {
  acceptInvitationSchema,
  invitationSchema,
  loginSchema,
  passwordResetRequestSchema,
  passwordResetSchema,
  tokenParamsSchema,
  userIdParamsSchema,
} from "./auth.schemas.js";
import type { AuthService } from "./auth.service.js";

interface Deps {
  config: Config;
  auth: AuthService;
  passport: Authenticator;
  csrfToken: (req: Request, overwrite?: boolean) => string;
}

function authenticate(passport: Authenticator, req: Request): Promise<Actor | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate("local", { session: false }, (err: unknown, user: Actor | false) =>
      err ? reject(err) : resolve(user),
    )(req, undefined as never, reject);
  });
}

const logIn = (req: Request, actor: Actor) =>
  new Promise<void>((resolve, reject) => req.logIn(actor, (err) => (err ? reject(err) : resolve())));
const logOut = (req: Request) => new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));

export function createAuthRouter({ config, auth, passport, csrfToken }: Deps): Router {
  const router = Router();
  const tooMany = "Too many unsuccessful sign-in attempts.";
  const perIp = limiter({
    windowMs: config.login.windowMs,
    limit: config.login.maxFailures,
    failuresOnly: true,
    message: tooMany,
  });
  const perAccount = limiter({
    windowMs: config.login.windowMs,
    limit: config.login.maxFailures,
    failuresOnly: true,
    key: accountKey,
    message: tooMany,
  });
  const resetLimit = limiter({ windowMs: config.login.windowMs, limit: 10, message: "Too many password reset requests." });

  router.get("/csrf", (req, res) => {
    res.json(shaped(csrfResponse, { csrfToken: csrfToken(req) }));
  });

  router.post("/login", perIp, perAccount, async (req, res) => {
    req.body = parse(loginSchema, req.body);
    const actor = await authenticate(passport, req);
    if (!actor)
      throw new AppError(401, "invalid_credentials", "That e-mail address and password do not match an active account.");
    // passport ≥ 0.6 regenerates the session here, so a pre-sign-in session id is never reused.
    await logIn(req, actor);
    res.json(shaped(loginResponse, { user: toMeDto(actor), csrfToken: csrfToken(req, true) }));
  });

  router.post("/logout", async (req, res) => {
    if (req.user) await logOut(req);
    res.status(204).end();
  });

  router.get("/me", requireAuth, (req, res) => {
    res.json(toMeDto(actorOf(req)));
  });

  router.post("/invitations", requireRole("admin", "officer"), async (req, res) => {
    const input = parse(invitationSchema, req.body);
    const result = await auth.invite(actorOf(req), input);
    res.status(201).json(shaped(invitationCreatedResponse, { userId: result.userId, expiresAt: result.expiresAt.toISOString() }));
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

  router.post("/password-reset", resetLimit, async (req, res) => {
    const { email } = parse(passwordResetRequestSchema, req.body);
    await auth.requestPasswordReset(email);
    res.status(202).json(
      shaped(passwordResetRequestedResponse, {
        message: "If an active account uses that address, we have sent it a link to choose a new password.",
      }),
    );
  });

  router.post("/password-reset/confirm", async (req, res) => {
    const { token, password } = parse(passwordResetSchema, req.body);
    await auth.resetPassword(token, password);
    res.status(204).end();
  });

  return router;
}
