import type { Request, RequestHandler } from "express";
import { ipKeyGenerator, rateLimit, type AugmentedRequest } from "express-rate-limit";
import { TooManyRequestsError } from "../lib/errors.js";

interface LimitOptions {
  windowMs: number;
  limit: number;
  /** Count only failed requests (status ≥ 400): successful sign-ins do not use up the allowance. */
  failuresOnly?: boolean;
  key?: (req: Request) => string;
  /** Requests for which the limit does not apply (they are not counted either). */
  skip?: (req: Request) => boolean;
  message: string;
  /** Said after "Try again in N minutes." */
  hint?: string;
}

/** One in-memory limiter. Each createApp() makes its own, so separate apps (and tests) do not share counts. */
export function limiter(o: LimitOptions): RequestHandler {
  return rateLimit({
    windowMs: o.windowMs,
    limit: o.limit,
    skipSuccessfulRequests: o.failuresOnly ?? false,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // The client's address as Express gives it (TRUST_PROXY decides how many proxy hops it believes);
    // IPv6 addresses are grouped by /56 so one household's many addresses count as one.
    keyGenerator: o.key ?? ((req) => ipKeyGenerator(req.ip ?? "unknown")),
    ...(o.skip ? { skip: o.skip } : {}),
    handler: (req, _res, next) => {
      const reset = (req as AugmentedRequest).rateLimit?.resetTime?.getTime() ?? Date.now() + o.windowMs;
      const retryAfterSeconds = Math.max(1, Math.ceil((reset - Date.now()) / 1000));
      const minutes = Math.ceil(retryAfterSeconds / 60);
      next(
        new TooManyRequestsError(
          `${o.message} Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.${o.hint ? ` ${o.hint}` : ""}`,
          retryAfterSeconds,
        ),
      );
    },
  });
}

/** The e-mail address a request's body names, trimmed and lower-cased ("" when none). */
export const bodyEmail = (req: Request) =>
  String((req.body as { email?: unknown } | undefined)?.email ?? "")
    .trim()
    .toLowerCase();
