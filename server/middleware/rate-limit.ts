import type { Request, RequestHandler } from "express";
import { ipKeyGenerator, rateLimit, type AugmentedRequest } from "express-rate-limit";
import { TooManyRequestsError } from "../lib/errors.js";

interface LimitOptions {
  windowMs: number;
  limit: number;
  /** Count only failed requests (status ≥ 400): successful sign-ins do not use up the allowance. */
  failuresOnly?: boolean;
  key?: (req: Request) => string;
  message: string;
}

/** One in-memory limiter. Each createApp() makes its own, so separate apps (and tests) do not share counts. */
export function limiter(o: LimitOptions): RequestHandler {
  return rateLimit({
    windowMs: o.windowMs,
    limit: o.limit,
    skipSuccessfulRequests: o.failuresOnly ?? false,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    keyGenerator: o.key ?? ((req) => ipKeyGenerator(req.ip ?? "unknown")),
    handler: (req, _res, next) => {
      const reset = (req as AugmentedRequest).rateLimit?.resetTime?.getTime() ?? Date.now() + o.windowMs;
      const retryAfterSeconds = Math.max(1, Math.ceil((reset - Date.now()) / 1000));
      const minutes = Math.ceil(retryAfterSeconds / 60);
      next(
        new TooManyRequestsError(`${o.message} Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`, retryAfterSeconds),
      );
    },
  });
}

export const accountKey = (req: Request) =>
  `account:${String((req.body as { email?: unknown } | undefined)?.email ?? "")
    .trim()
    .toLowerCase()}`;
