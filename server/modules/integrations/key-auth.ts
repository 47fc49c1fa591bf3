// Key authentication for the integration API (/api/v1): the Bearer key, its scope per route, its own
// rate limit, and an audit entry for each write. Sessions and CSRF play no part here.
import type { Request, RequestHandler } from "express";
import type { ApiScope } from "../../../src/lib/contracts/integrations.js";
import { AppError, UnauthorizedError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import type { RateLimits } from "../../middleware/rate-limit.js";
import type { ApiKeyService, KeyCaller } from "./api-key.service.js";

const callers = new WeakMap<Request, KeyCaller>();

/** The key and actor of a key-authenticated request; only behind `authenticateKey`. */
export function callerOf(req: Request): KeyCaller {
  const caller = callers.get(req);
  if (!caller) throw new UnauthorizedError();
  return caller;
}

export function authenticateKey(keys: ApiKeyService): RequestHandler {
  return async (req, _res, next) => {
    callers.set(req, await keys.authenticate(req.get("authorization")));
    next();
  };
}

/** Each write made with a key is recorded with its answer's status, refusals and 429s included. */
export function auditKeyWrites(keys: ApiKeyService, logger: Logger): RequestHandler {
  return (req, res, next) => {
    if (req.method !== "GET" && req.method !== "HEAD") {
      const { key } = callerOf(req);
      const path = req.originalUrl.split("?")[0] ?? req.originalUrl;
      res.on("finish", () => {
        keys.recordWrite(key, { method: req.method, path, status: res.statusCode }).catch((err: unknown) => {
          logger.error({ err, apiKeyId: key.id, path }, "an API key write could not be audited");
        });
      });
    }
    next();
  };
}

/** Requests per key per minute (API_KEY_REQUESTS_PER_MINUTE); over it, 429 with Retry-After. */
export function limitPerKey(rateLimits: RateLimits, requestsPerMinute: number): RequestHandler {
  return rateLimits.limiter({
    name: "api-key",
    windowMs: 60_000,
    limit: requestsPerMinute,
    key: (req) => `api-key:${callerOf(req).key.id}`,
    message: "Too many requests with this API key.",
  });
}

/** The route's scope: 403 naming it when the key does not hold it. */
export function requireScope(keys: ApiKeyService, scope: ApiScope): RequestHandler {
  return (req, _res, next) => {
    if (!keys.allows(callerOf(req).key, scope)) {
      throw new AppError(403, "scope_missing", `This API key does not have the scope ${scope}.`, { scope });
    }
    next();
  };
}
