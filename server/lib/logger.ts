import { pino, type DestinationStream, type Logger } from "pino";

/**
 * Credentials that reach us in headers never reach the log: session cookies, CSRF tokens, and the
 * `Authorization` header that carries integration API keys and sensors' secrets.
 */
export const REDACTED_PATHS = [
  "req.headers.cookie",
  "req.headers['x-csrf-token']",
  "req.headers.authorization",
  "res.headers['set-cookie']",
];

export function createLogger(level: string, destination?: DestinationStream): Logger {
  return pino({ level, base: undefined, redact: REDACTED_PATHS }, destination);
}
export type { Logger };
