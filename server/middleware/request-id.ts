// One id per request, on the response (`X-Request-Id`), in every log line (pino-http reads `req.id`)
// and in 500 bodies, so a person reporting an error can quote it and we can find the request.
import { randomUUID } from "node:crypto";
import type { RequestHandler } from "express";

export const REQUEST_ID_HEADER = "X-Request-Id";

// A proxy's id is kept when it looks like an id (UUIDs, hex, short tokens); anything else, which could
// be used to forge or flood log lines, is replaced by our own.
const SANE_ID = /^[A-Za-z0-9][A-Za-z0-9._:-]{0,127}$/;

export function requestId(): RequestHandler {
  return (req, res, next) => {
    const incoming = req.get(REQUEST_ID_HEADER);
    const id = incoming && SANE_ID.test(incoming) ? incoming : randomUUID();
    req.id = id;
    res.setHeader(REQUEST_ID_HEADER, id);
    next();
  };
}
