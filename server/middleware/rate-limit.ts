// Rate limits, counted in MariaDB so that every app instance counts the same hits (rate-limit-store.ts).
import type { Request, RequestHandler } from "express";
import { ipKeyGenerator, rateLimit, type AugmentedRequest } from "express-rate-limit";
import type { DataSource } from "typeorm";
import { TooManyRequestsError } from "../lib/errors.js";
import type { Logger } from "../lib/logger.js";
import { DatabaseRateLimitStore } from "./rate-limit-store.js";

export interface LimitOptions {
  /** The limit's own name (part of its keys): two limits counting the same address keep separate counts. */
  name: string;
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

/**
 * Makes the app's limiters. Each createApp() makes its own RateLimits; apps with the same `scope`
 * (every instance in production: "") share counts, so tests give each app its own scope unless they
 * mean two apps to count together.
 */
export class RateLimits {
  constructor(
    private readonly dataSource: DataSource,
    private readonly logger: Logger,
    private readonly scope = "",
  ) {}

  limiter(o: LimitOptions): RequestHandler {
    return limiter(o, new DatabaseRateLimitStore(this.dataSource, `${this.scope}${o.name}:`), this.logger);
  }
}

function limiter(o: LimitOptions, store: DatabaseRateLimitStore, logger: Logger): RequestHandler {
  return rateLimit({
    store,
    // The database away: the request goes on unlimited (and the log says so) rather than refused.
    passOnStoreError: true,
    logger: {
      error: (error: unknown) =>
        logger.warn(
          { err: error instanceof Error ? error.message : String(error), limit: o.name },
          "rate limit not counted: the database did not answer",
        ),
      warn: (message: unknown) => logger.warn({ limit: o.name }, String(message)),
    },
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
        ).saying(o.message, { id: "try-again-in", values: { minutes } }, ...(o.hint ? [o.hint] : [])),
      );
    },
  });
}

/** The e-mail address a request's body names, trimmed and lower-cased ("" when none). */
export const bodyEmail = (req: Request) =>
  String((req.body as { email?: unknown } | undefined)?.email ?? "")
    .trim()
    .toLowerCase();
