// What a database error means for the caller: retry the transaction, or tell the client to come back later.
import { ServiceUnavailableError } from "./errors.js";

interface DriverErrorLike {
  code?: unknown;
  errno?: unknown;
  message?: unknown;
  driverError?: DriverErrorLike;
}

const codeOf = (err: unknown): { code?: string; errno?: number; message?: string } => {
  const e = (err ?? {}) as DriverErrorLike;
  const d = e.driverError ?? e;
  return {
    code: typeof d.code === "string" ? d.code : typeof e.code === "string" ? e.code : undefined,
    errno: typeof d.errno === "number" ? d.errno : typeof e.errno === "number" ? e.errno : undefined,
    message: typeof d.message === "string" ? d.message : typeof e.message === "string" ? e.message : undefined,
  };
};

/** ER_LOCK_DEADLOCK (1213) and ER_LOCK_WAIT_TIMEOUT (1205): the whole transaction can simply run again. */
export function isRetryableTransactionError(err: unknown): boolean {
  const { code, errno } = codeOf(err);
  return errno === 1213 || errno === 1205 || code === "ER_LOCK_DEADLOCK" || code === "ER_LOCK_WAIT_TIMEOUT";
}

const UNAVAILABLE_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EPIPE",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "ENOTFOUND",
  "EAI_AGAIN",
  "PROTOCOL_CONNECTION_LOST",
  "PROTOCOL_SEQUENCE_TIMEOUT",
  "ER_CON_COUNT_ERROR",
  "ER_SERVER_SHUTDOWN",
  "ER_NORMAL_SHUTDOWN",
  "ER_SHUTDOWN_COMPLETE",
  "ER_STATEMENT_TIMEOUT",
  "DB_UNAVAILABLE",
]);
// 1040 too many connections, 1053 shutdown in progress, 1077/1079 shutdown, 1969 max_statement_time, 2002/2003/2006/2013 client-side.
const UNAVAILABLE_ERRNOS = new Set([1040, 1053, 1077, 1079, 1969, 2002, 2003, 2006, 2013]);

/** The database cannot be reached, stalls, or is shutting down: a 503, not a 500. */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (ownUnavailable(err)) return true;
  const { code, errno, message } = codeOf(err);
  if ((code && UNAVAILABLE_CODES.has(code)) || (errno !== undefined && UNAVAILABLE_ERRNOS.has(errno))) return true;
  // mysql2 and TypeORM say so in words only.
  return (
    typeof message === "string" &&
    /connection is in closed state|Pool is closed|Connection lost|Query inactivity timeout/i.test(message)
  );
}

/** The answer while the database is down or stalled: 503 with Retry-After. */
export class DatabaseUnavailableError extends ServiceUnavailableError {
  readonly driverCode = "DB_UNAVAILABLE";
  constructor(
    message = "The service is briefly unavailable: our database is not answering. Please try again in a few seconds.",
    retryAfterSeconds = 5,
  ) {
    super(message, retryAfterSeconds);
  }
}

/** Ours, thrown by the guarded pool, as is or wrapped by TypeORM in a QueryFailedError. */
function ownUnavailable(err: unknown): DatabaseUnavailableError | null {
  if (err instanceof DatabaseUnavailableError) return err;
  const inner = (err as { driverError?: unknown } | null)?.driverError;
  return inner instanceof DatabaseUnavailableError ? inner : null;
}

/** The 503 for a database error that means "unavailable", or null for any other error. */
export function asUnavailable(err: unknown): DatabaseUnavailableError | null {
  const own = ownUnavailable(err);
  if (own) return own;
  if (isDatabaseUnavailable(err)) return new DatabaseUnavailableError();
  if (isRetryableTransactionError(err)) {
    // Still deadlocking after the retries (tx helper): busy, not broken.
    return new DatabaseUnavailableError("The service is busy right now. Please try again in a moment.", 1);
  }
  return null;
}
