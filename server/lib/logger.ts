import { pino, type Logger } from "pino";

export function createLogger(level: string): Logger {
  return pino({
    level,
    base: undefined,
    redact: ["req.headers.cookie", "req.headers['x-csrf-token']", "res.headers['set-cookie']"],
  });
}
export type { Logger };
