// Typed errors thrown by services and middleware; the error handler turns them into
// `{ error: { code, message, details? } }` with the matching HTTP status.
export class AppError extends Error {
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
