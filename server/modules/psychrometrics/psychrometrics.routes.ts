import express, { Router, type RequestHandler } from "express";
import type session from "express-session";
import { ipKeyGenerator } from "express-rate-limit";
import { evaluatePoint } from "../../../src/lib/domain/index.js";
import { evaluatePointSchema, MAX_SERIES_READINGS } from "../../../src/lib/schemas/psychrometrics.js";
import type { Clock } from "../../lib/clock.js";
import { AppError, PayloadTooLargeError, TooManyRequestsError, ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import type { RateLimits } from "../../middleware/rate-limit.js";
import type { WorkerPool } from "../../workers/pool.js";
import { ReadingBudget } from "./reading-budget.js";
import { recogniseSignedIn } from "./signed-in.js";

export interface PsychrometricsDeps {
  workers: WorkerPool;
  clock: Clock;
  /** Readings each address may have evaluated a minute; most readings in one anonymous request. */
  limits: { readingsPerMinute: number; maxAnonymousReadings: number };
  /** Only read, to give signed-in callers the larger size limit (see signed-in.ts). */
  session: { store: session.Store; secret: string; cookieName: string };
  /** The app's rate limits (counted in the database, across instances). */
  rateLimits: RateLimits;
}

/** Bytes of JSON one reading may take (all fields, long numbers), for the body limit. */
const BYTES_PER_READING = 250;

/**
 * The public risk-engine API: no sign-in, no CSRF token (it computes and stores nothing).
 * A point is cheap and limited to 120 requests a minute per address. A series is charged by its
 * readings against a per-address budget, runs on the worker pool, and is capped at
 * maxAnonymousReadings for anonymous callers and MAX_SERIES_READINGS for signed-in ones.
 */
export function createPsychrometricsRouter(deps: PsychrometricsDeps): Router {
  const router = Router();
  const budget = new ReadingBudget(deps.limits.readingsPerMinute, deps.clock);
  const anonymousMax = Math.min(deps.limits.maxAnonymousReadings, MAX_SERIES_READINGS);
  // A year of readings at 5-minute intervals is about 10 MB of JSON; the reading count is checked below.
  // The body is taken as bytes and parsed on the worker pool, never on the request thread.
  const anonymousLimit = Math.max(64 * 1024, anonymousMax * BYTES_PER_READING);
  const signedInLimit = MAX_SERIES_READINGS * BYTES_PER_READING;
  const anonymousBody = express.raw({ type: "application/json", limit: anonymousLimit });
  const signedInBody = express.raw({ type: "application/json", limit: signedInLimit });
  const tooManyReadings = (limit: number) =>
    `The series is too large to evaluate: at most ${limit.toLocaleString("en-GB")} readings per request${limit < MAX_SERIES_READINGS ? " without signing in (sign in for up to " + MAX_SERIES_READINGS.toLocaleString("en-GB") + ")" : ""}.`;
  const outOfBudget = (retryAfterSeconds: number) => {
    const minutes = Math.ceil(retryAfterSeconds / 60);
    return new TooManyRequestsError(
      `This address has had its ${deps.limits.readingsPerMinute.toLocaleString("en-GB")} readings a minute evaluated. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`,
      retryAfterSeconds,
    );
  };
  /**
   * Refuses from the Content-Length alone, before a byte of the body is read: a body over the caller's
   * limit, or one whose fewest possible readings (at BYTES_PER_READING each) the address's budget cannot
   * cover (anonymous callers). Reading and discarding megabytes per refused request would itself hold up the request thread.
   * The connection is closed after the answer, so the unread body is never drained.
   */
  const refuseEarly: RequestHandler = (req, res, next) => {
    const length = Number(req.get("content-length"));
    if (!Number.isFinite(length)) return next();
    const signedIn = res.locals.signedIn === true;
    const refuse = (error: Error) => {
      res.setHeader("Connection", "close");
      next(error);
    };
    if (length > (signedIn ? signedInLimit : anonymousLimit))
      return refuse(new PayloadTooLargeError(tooManyReadings(signedIn ? MAX_SERIES_READINGS : anonymousMax)));
    const fewest = Math.max(1, Math.floor(length / BYTES_PER_READING));
    res.locals.fewestReadings = fewest;
    const max = signedIn ? MAX_SERIES_READINGS : anonymousMax;
    if (fewest > max) return refuse(new PayloadTooLargeError(tooManyReadings(max)));
    // Anonymous callers only: a signed-in caller's body is read, so a series over the size limit is
    // told so (413) rather than that the budget is spent.
    if (!signedIn) {
      const there = budget.has(ipKeyGenerator(req.ip ?? "unknown"), fewest);
      if (!there.ok) return refuse(outOfBudget(there.retryAfterSeconds));
    }
    next();
  };
  const body: RequestHandler = (req, res, next) => (res.locals.signedIn ? signedInBody : anonymousBody)(req, res, next);

  router.post(
    "/evaluate",
    deps.rateLimits.limiter({
      name: "calculator-point",
      windowMs: 60_000,
      limit: 120,
      message: "Too many calculations from this address.",
    }),
    express.json({ limit: "100kb" }),
    (req, res) => {
      const input = parse(evaluatePointSchema, req.body);
      res.json(evaluatePoint(input));
    },
  );

  router.post(
    "/series",
    // A ceiling on requests too, far above what the reading budget lets through for real series.
    deps.rateLimits.limiter({
      name: "calculator-series",
      windowMs: 60_000,
      limit: 1_000,
      message: "Too many calculations from this address.",
    }),
    recogniseSignedIn(deps.session),
    refuseEarly,
    body,
    async (req, res) => {
      const signedIn = res.locals.signedIn === true;
      const max = signedIn ? MAX_SERIES_READINGS : anonymousMax;
      const key = ipKeyGenerator(req.ip ?? "unknown");
      // An anonymous caller's fewest readings the body can hold (from its length) are spent before the
      // work starts, the rest once the worker has counted them. A signed-in caller's are all spent after
      // (so a body over the size limit is told so, not that the budget is spent).
      const fewest = signedIn ? 0 : ((res.locals.fewestReadings as number | undefined) ?? 1);
      const reserved = budget.take(key, fewest);
      if (!reserved.ok) throw outOfBudget(reserved.retryAfterSeconds);
      const json = Buffer.isBuffer(req.body) ? req.body : Buffer.from("{}");
      const out = await deps.workers.run("evaluateSeriesRequest", {
        json,
        maxReadings: max,
        allowance: fewest + budget.available(key),
      });
      if (out.ok) {
        budget.charge(key, out.count - fewest);
        res.json(out.result);
        return;
      }
      if (out.refused === "invalid-json") throw new AppError(400, "invalid_json", "The request body is not valid JSON.");
      if (out.refused === "invalid") throw new ValidationError(out.message, out.details);
      budget.charge(key, -fewest);
      if (out.refused === "too-many") {
        throw new PayloadTooLargeError(
          `readings can hold at most ${max.toLocaleString("en-GB")} readings per request${signedIn ? "" : " without signing in (sign in for up to " + MAX_SERIES_READINGS.toLocaleString("en-GB") + ")"}; this one has ${out.count.toLocaleString("en-GB")}.`,
        );
      }
      const wait = budget.has(key, out.count);
      throw outOfBudget(wait.ok ? 1 : wait.retryAfterSeconds);
    },
  );

  return router;
}
