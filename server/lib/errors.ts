import type enErrors from "../locales/en-GB/errors.js";

/** The id of an error message a tenant can meet (server/locales/<lng>/errors.ts). */
export type ErrorMessageId = keyof typeof enErrors;

/**
 * One part of an error's message for the tenant's language: a message id with its values, or English
 * text that is one of the catalogue's messages without placeholders (found by its text).
 */
export type Phrase = string | { id: ErrorMessageId; values?: Record<string, string | number> };

// Typed errors thrown by services and middleware; the error handler turns them into
// `{ error: { code, message, details? } }` with the matching HTTP status.
export class AppError extends Error {
  /**
   * The message as phrases of the error catalogue, when it is not one catalogue text as it stands (it has
   * values, or is made of several parts joined by spaces). Only read to answer a Welsh tenant; the English
   * `message` is always what the thrower wrote.
   */
  phrases?: readonly Phrase[];

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = new.target.name;
  }

  /** Names the message's phrases in the error catalogue (see `phrases`); returns the error itself. */
  saying(...phrases: Phrase[]): this {
    this.phrases = phrases;
    return this;
  }
}

export class ValidationError extends AppError {
  constructor(message: string, details?: unknown) {
    super(400, "validation_failed", message, details);
  }
}
export class UnauthorizedError extends AppError {
  constructor(message = "Please sign in to continue.") {
    super(401, "unauthorised", message);
  }
}
export class ForbiddenError extends AppError {
  constructor(message = "You are not allowed to do that.", code = "forbidden") {
    super(403, code, message);
  }
}
export class NotFoundError extends AppError {
  constructor(message = "Not found.") {
    super(404, "not_found", message);
  }
}
export class ConflictError extends AppError {
  constructor(message: string, details?: unknown) {
    super(409, "conflict", message, details);
  }
}
export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super(413, "payload_too_large", message);
  }
}
export class UnsupportedMediaTypeError extends AppError {
  constructor(message: string) {
    super(415, "unsupported_media_type", message);
  }
}
export class UnprocessableError extends AppError {
  constructor(message: string, details?: unknown) {
    super(422, "unprocessable", message, details);
  }
}
export class TooManyRequestsError extends AppError {
  constructor(message: string, retryAfterSeconds: number) {
    super(429, "too_many_requests", message, { retryAfterSeconds }, { "Retry-After": String(retryAfterSeconds) });
  }
}
export class ServiceUnavailableError extends AppError {
  constructor(message: string, retryAfterSeconds = 5) {
    super(503, "service_unavailable", message, { retryAfterSeconds }, { "Retry-After": String(retryAfterSeconds) });
  }
}
