// `Idempotency-Key` on POSTs that create something: a retry (after a lost answer, a failover, a
// double click) gets the first request's answer and creates nothing twice.
//
// Why the key is recorded inside the write's own transaction: behind Galera a commit can replicate
// while its OK packet is lost, so the app answers 5xx for a row that exists and the client retries.
// A key recorded in a separate step could be missing exactly then. Here the request's first
// transaction (opened with `dataSource.transaction` or `inTransaction`, see hookTransactions in
// server/lib/transaction.ts) inserts the key row first; the create and the key commit together or
// not at all. A second request with the same key waits on that row's lock inside its own
// transaction and, once the first commits, rolls back and answers with the first's answer.
//
// - Answers below 500 are stored with the key and replayed (same status and JSON body, plus
//   `Idempotent-Replayed: true`). A 5xx is not stored: the write may have committed (the lost-OK
//   case), so a retry that finds the key without an answer says 409 `already_applied`.
// - An answer marked `Cache-Control: no-store` carries a secret shown once (an API key, a sensor's
//   credentials): it is not kept, so a retry gets 409 `already_applied` saying so.
// - A request that writes nothing (no transaction) stores nothing: a retry simply runs again.
// - Reusing a key for another method, path or body is a 422.
import { AsyncResource } from "node:async_hooks";
import { createHash, type Hash } from "node:crypto";
import { createReadStream } from "node:fs";
import type { ErrorRequestHandler, Request, RequestHandler, Response } from "express";
import { AppError, ValidationError } from "../lib/errors.js";
import type { Logger } from "../lib/logger.js";
import { withTransactionHook, type TransactionHook } from "../lib/transaction.js";
import type { IdempotencyKey } from "../modules/idempotency/idempotency-key.entity.js";
import {
  IdempotencyKeyTakenError,
  type IdempotencyScope,
  type IdempotencyService,
} from "../modules/idempotency/idempotency.service.js";

export const IDEMPOTENCY_KEY_HEADER = "Idempotency-Key";
export const REPLAYED_HEADER = "Idempotent-Replayed";
/** Visible ASCII, no spaces: a UUID fits, and nothing in it can upset a log line or a header. */
const KEY_PATTERN = /^[\x21-\x7E]{1,100}$/;
/** How long a retry waits for the first request (committed, still answering) to store its answer. */
export const DEFAULT_ANSWER_WAIT_MS = 5000;

export interface IdempotencyOptions {
  service: IdempotencyService;
  logger: Logger;
  /** Whose key this is; null when the caller is anonymous (the header is then ignored). */
  scopeOf(req: Request): IdempotencyScope | null;
  waitMs?: number;
}

type Phase = "open" | "claiming" | "claimed" | "done";

interface KeyedRequest {
  key: string;
  scope: IdempotencyScope;
  path: string;
  phase: Phase;
  /** The request's fingerprint, once worked out (uploaded files are deleted when the handler ends). */
  hash?: string;
  /** Answers this request once its transaction found the key taken by an earlier one. */
  onTaken: (res: Response, next: (err?: unknown) => void) => void;
}

const keyed = new WeakMap<Request, KeyedRequest>();

class AlreadyAppliedError extends AppError {
  constructor(message: string) {
    super(409, "already_applied", message);
  }
}

const ALREADY_APPLIED =
  "This was already saved by an earlier attempt with the same Idempotency-Key, but its answer was not kept. Refresh to see the result; do not send it again.";
const SECRET_WITHHELD =
  "This was already done by an earlier attempt with the same Idempotency-Key. Its secret is shown only once, so it cannot be shown again: refresh, and if the secret was lost, revoke it and issue a new one.";
const KEY_REUSED = "This Idempotency-Key was already used for a different request. Send a new key with each new submission.";

/** JSON with every object's keys sorted, so the same body always hashes the same. */
function stableJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stableJson).join(",")}]`;
  if (value && typeof value === "object" && !Buffer.isBuffer(value)) {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${stableJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value ?? null);
}

function uploadedFiles(req: Request): Express.Multer.File[] {
  const files = req.files;
  const list = Array.isArray(files) ? files : files ? Object.values(files).flat() : [];
  return req.file ? [req.file, ...list] : list;
}

const hashFile = (hash: Hash, file: string) =>
  new Promise<void>((resolve, reject) => {
    createReadStream(file)
      .on("data", (chunk) => hash.update(chunk))
      .on("end", resolve)
      .on("error", reject);
  });

/** SHA-256 of what the request asks: method, path, body, and each uploaded file's bytes. */
async function fingerprint(req: Request, path: string): Promise<string> {
  const hash = createHash("sha256");
  hash.update(`${req.method} ${path}\n`);
  hash.update(Buffer.isBuffer(req.body) ? req.body : Buffer.from(stableJson(req.body ?? null)));
  for (const file of uploadedFiles(req)) {
    hash.update(`\n${file.fieldname}:${file.originalname}:${file.size}\n`);
    if (file.buffer) hash.update(file.buffer);
    else await hashFile(hash, file.path);
  }
  return hash.digest("hex");
}

/** Mount after authentication and body parsing (a multipart body is read later: that works too). */
export function idempotency({ service, logger, scopeOf, waitMs = DEFAULT_ANSWER_WAIT_MS }: IdempotencyOptions): RequestHandler {
  /** Replays the stored answer of `row`, or says why it cannot. */
  const answerWith = async (req: Request, res: Response, state: KeyedRequest, found: IdempotencyKey): Promise<void> => {
    state.hash ??= await fingerprint(req, state.path);
    if (found.method !== req.method || found.path !== state.path || found.requestHash !== state.hash) {
      throw new AppError(422, "idempotency_key_reused", KEY_REUSED);
    }
    const row = found.responseStatus === null ? ((await service.waitForAnswer(state.scope, state.key, waitMs)) ?? found) : found;
    if (row.responseStatus === null) throw new AlreadyAppliedError(ALREADY_APPLIED);
    if (row.bodyWithheld) throw new AlreadyAppliedError(SECRET_WITHHELD);
    res.status(row.responseStatus).set(REPLAYED_HEADER, "true");
    if (row.responseBody === null) res.end();
    else res.type("application/json").send(row.responseBody);
  };

  /** Stores the answer with the key (before sending it, so a client holding an answer finds it stored). */
  const captureAnswers = (res: Response, state: KeyedRequest) => {
    const json = res.json.bind(res);
    res.json = (body?: unknown) => {
      const claimed = state.phase === "claimed";
      if (state.phase === "open" || claimed) state.phase = "done";
      if (!claimed || res.statusCode >= 500) return json(body);
      const withheld = /no-store/i.test(String(res.getHeader("Cache-Control") ?? ""));
      const text = body === undefined ? null : JSON.stringify(body);
      service
        .storeAnswer(state.scope, state.key, res.statusCode, withheld ? null : text, withheld)
        .catch((err: unknown) => logger.error({ err, key: state.key }, "an idempotent answer could not be stored"))
        .finally(() => json(body));
      return res;
    };
    // An answer without a JSON body (204, a redirect): its status alone is replayed.
    res.on("finish", () => {
      if (state.phase !== "claimed") return;
      state.phase = "done";
      if (res.statusCode >= 500) return;
      service
        .storeAnswer(state.scope, state.key, res.statusCode, null, false)
        .catch((err: unknown) => logger.error({ err, key: state.key }, "an idempotent answer could not be stored"));
    });
  };

  const hookFor = (req: Request, res: Response, state: KeyedRequest): TransactionHook => ({
    async begin(m) {
      // One key row per request: not again once claimed, not by a second transaction running
      // alongside the claiming one, and not by work carrying on after the answer was sent.
      if (state.phase !== "open" || res.headersSent) return false;
      state.phase = "claiming";
      try {
        state.hash ??= await fingerprint(req, state.path);
        await service.claim(m, state.scope, state.key, { method: req.method, path: state.path, hash: state.hash });
        return true;
      } catch (error) {
        state.phase = "open";
        throw error;
      }
    },
    committed() {
      state.phase = "claimed";
    },
    rolledBack() {
      if (state.phase === "claiming") state.phase = "open";
    },
  });

  const middleware: RequestHandler = async (req, res, next) => {
    if (req.method !== "POST") return next();
    const key = req.get(IDEMPOTENCY_KEY_HEADER);
    if (key === undefined) return next();
    if (!KEY_PATTERN.test(key)) {
      throw new ValidationError(
        `${IDEMPOTENCY_KEY_HEADER}: use 1 to 100 visible ASCII characters without spaces (a UUID is ideal).`,
        [{ field: IDEMPOTENCY_KEY_HEADER, message: "Use 1 to 100 visible ASCII characters without spaces." }],
      );
    }
    const scope = scopeOf(req);
    if (!scope) return next();
    const state: KeyedRequest = {
      key,
      scope,
      path: req.originalUrl.slice(0, 255),
      phase: "open",
      onTaken: (res, next) => {
        state.phase = "done";
        service
          .find(scope, key)
          .then(
            (found) => (found ? answerWith(req, res, state, found).catch(next) : next(new AlreadyAppliedError(ALREADY_APPLIED))),
            next,
          );
      },
    };
    keyed.set(req, state);
    const multipart = Boolean(req.is("multipart/form-data"));
    const found = await service.find(scope, key);
    // A multipart body is not read yet, so it cannot be compared here: such a retry runs until its
    // transaction meets the stored key (below, in `errors`).
    if (found && !multipart) return answerWith(req, res, state, found);
    captureAnswers(res, state);
    withTransactionHook(hookFor(req, res, state), () => {
      // The upload parser reads the body from the socket's callbacks, outside this request's async
      // context: re-enter it for each event, so the handler that runs after the upload still has the hook.
      if (multipart) req.emit = AsyncResource.bind(req.emit.bind(req)) as typeof req.emit;
      next();
    });
  };

  return middleware;
}

/** Mount before the app's error handler: answers a retry whose transaction met the first request's key. */
export const idempotencyErrors: ErrorRequestHandler = (err, req, res, next) => {
  const state = keyed.get(req);
  if (!(err instanceof IdempotencyKeyTakenError) || !state || res.headersSent) return next(err);
  state.onTaken(res, next);
};
