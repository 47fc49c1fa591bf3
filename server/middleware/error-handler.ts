import type { ErrorRequestHandler, RequestHandler } from "express";
import { asUnavailable } from "../lib/db-errors.js";
import { errorLanguage, translatedError } from "../lib/error-language.js";
import { AppError, NotFoundError } from "../lib/errors.js";

interface HttpLikeError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  expose?: boolean;
  message?: string;
}

/** Errors from libraries (body parser, CSRF, multer) that carry their own HTTP meaning. */
function fromLibrary(err: HttpLikeError & { name?: string; field?: string }): AppError | null {
  if (err.name === "MulterError") {
    if (err.code === "LIMIT_FILE_SIZE")
      return new AppError(413, "payload_too_large", "A file is too large: each photo can be at most 15 MB.");
    if (err.code === "LIMIT_FILE_COUNT") return new AppError(400, "too_many_files", "Send at most 10 photos at a time.");
    if (err.code === "LIMIT_UNEXPECTED_FILE") {
      return new AppError(
        400,
        "too_many_files",
        `Unexpected file field "${err.field ?? ""}", or too many files: send at most 10 photos at a time in the "photos" field.`,
      );
    }
    return new AppError(400, "bad_upload", "The upload could not be read. Please try again.");
  }
  if (err.code === "EBADCSRFTOKEN" || err.code === "csrf_invalid") {
    return new AppError(
      403,
      "csrf_invalid",
      "The security token of this request is missing or out of date. Reload the page and try again.",
    );
  }
  if (err.type === "entity.parse.failed") return new AppError(400, "invalid_json", "The request body is not valid JSON.");
  if (err.type === "entity.too.large") return new AppError(413, "payload_too_large", "The request body is too large.");
  if (err.type === "encoding.unsupported" || err.type === "charset.unsupported") {
    return new AppError(415, "unsupported_media_type", "The request body's encoding is not supported; send UTF-8 JSON.");
  }
  const status = err.status ?? err.statusCode;
  if (status && status >= 400 && status < 500 && err.expose !== false) {
    return new AppError(status, err.code ?? "bad_request", err.message ?? "Bad request.");
  }
  return null;
}

export function errorHandler(showInternals: boolean): ErrorRequestHandler {
  return (err, req, res, next) => {
    if (res.headersSent) {
      // The session store failing to touch or save after the reply was begun (the database went
      // down): express-session finishes the reply itself, so the answer already given stands.
      if (asUnavailable(err)) {
        req.log?.warn({ err }, "database unavailable after the response was begun");
        return;
      }
      next(err);
      return;
    }
    // A database that is down, stalled or still deadlocking after retries is a 503 with Retry-After.
    const known = err instanceof AppError ? err : (asUnavailable(err) ?? fromLibrary(err as HttpLikeError));
    if (!known) {
      req.log?.error({ err }, "unhandled error");
      res.status(500).json({
        error: {
          code: "internal",
          message: translatedError(errorLanguage(req), {
            message:
              "Something went wrong on our side. Please try again; if it keeps happening, tell your landlord's support team.",
          }).message,
          // The same id is in the X-Request-Id header and the log line of the error.
          requestId: req.id === undefined ? undefined : String(req.id),
          ...(showInternals ? { details: { message: String(err?.message ?? err), stack: err?.stack } } : {}),
        },
      });
      return;
    }
    if (known.headers) res.set(known.headers);
    // A tenant reads it in their language (server/lib/error-language.ts); staff and English as thrown.
    const { message, details } = translatedError(errorLanguage(req), known);
    res.status(known.status).json({
      error: { code: known.code, message, ...(details !== undefined ? { details } : {}) },
    });
  };
}

export const apiNotFound: RequestHandler = (req) => {
  throw new NotFoundError(`There is no API route ${req.method} ${req.originalUrl.split("?")[0]}.`);
};
