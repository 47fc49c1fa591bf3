import type { Request, RequestHandler } from "express";
import { ForbiddenError, UnauthorizedError } from "../lib/errors.js";
import type { Actor } from "../modules/auth/actor.js";
import { STAFF_ROLES, type Role } from "../modules/users/user.entity.js";

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport's req.user is our Actor (declaration merging needs the empty body).
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends Actor {}
  }
}

/** The signed-in user; only call behind requireAuth/requireRole. */
export function actorOf(req: Request): Actor {
  if (!req.user) throw new UnauthorizedError();
  return req.user;
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  actorOf(req);
  next();
};

export function requireRole(...roles: readonly Role[]): RequestHandler {
  return (req, _res, next) => {
    const actor = actorOf(req);
    if (!roles.includes(actor.role)) {
      throw new ForbiddenError("Your account is not allowed to use this part of Dewline.", "role_not_allowed");
    }
    next();
  };
}

export const requireStaff = requireRole(...STAFF_ROLES);
