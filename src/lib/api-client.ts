/**
 * The one way the client talks to the server: JSON under /api (or FormData for uploads), same-origin
 * cookies, a CSRF token on every state-changing request, an `Idempotency-Key` on every POST (retried
 * with the same key when the connection or a gateway fails), and one error shape (`ApiError`) for
 * everything that fails.
 */

import type { FieldErrorDetail } from "@/lib/contracts";

export type ApiErrorDetail = FieldErrorDetail;

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details?: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /** Field-level messages of a 400 validation error, if the server sent them. */
  get fieldErrors(): ApiErrorDetail[] {
    if (!Array.isArray(this.details)) return [];
    return this.details.filter(
      (d): d is ApiErrorDetail =>
        typeof d === "object" && d !== null && typeof d.field === "string" && typeof d.message === "string",
    );
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

const NETWORK_MESSAGE = "We could not reach Dewline. Check your internet connection and try again.";
const UNKNOWN_MESSAGE = "Something went wrong on our side. Please try again in a moment.";

const UNSAFE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);
/** Answers from a proxy or a server that may not have seen (or finished) the request: worth a retry. */
const RETRY_STATUSES = new Set([502, 503, 504]);
/** Waits before the second and third try of a POST: enough for a load balancer to move to another instance. */
export const POST_RETRY_DELAYS_MS = [300, 1000];

/**
 * A fresh key for one POST (one form submission). `crypto.randomUUID` exists only on HTTPS and
 * localhost; elsewhere the same kind of UUID is made from `getRandomValues`, which exists everywhere.
 */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40;
  b[8] = (b[8]! & 0x3f) | 0x80;
  const hex = Array.from(b, (x) => x.toString(16).padStart(2, "0")).join("");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

const pause = (ms: number, signal?: AbortSignal) =>
  new Promise<void>((resolve, reject) => {
    if (signal?.aborted) return reject(signal.reason);
    const timer = setTimeout(resolve, ms);
    signal?.addEventListener("abort", () => {
      clearTimeout(timer);
      reject(signal.reason);
    });
  });

let csrfToken: string | null = null;
let csrfRequest: Promise<string> | null = null;

/** Stores the token the server handed out (after sign-in the session is new, so is the token). */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
  csrfRequest = null;
}

/** Forgets the token (after sign-out): the next unsafe request fetches a fresh one. */
export function clearCsrfToken(): void {
  setCsrfToken(null);
}

async function fetchCsrfToken(): Promise<string> {
  const body = await request<{ csrfToken: string }>("GET", "/auth/csrf", {});
  return body.csrfToken;
}

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  // Several requests at once share one token fetch.
  csrfRequest ??= fetchCsrfToken().then(
    (token) => {
      csrfToken = token;
      csrfRequest = null;
      return token;
    },
    (err: unknown) => {
      csrfRequest = null;
      throw err;
    },
  );
  return csrfRequest;
}

export type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  body?: unknown;
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
  /**
   * A POST's key chosen by the caller: a report kept on the phone while offline is sent later with
   * the key it was first given, so sending it again after a lost answer never makes it twice.
   */
  idempotencyKey?: string;
}

/** The address of an API path with its query (empty values left out): for requests, and for download links. */
export function apiUrl(path: string, query?: Record<string, QueryValue>): string {
  const url = `/api${path.startsWith("/") ? path : `/${path}`}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === "") continue;
    params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `${url}?${qs}` : url;
}

async function toApiError(res: Response): Promise<ApiError> {
  let payload: unknown = null;
  try {
    payload = await res.json();
  } catch {
    // Not JSON (a proxy page, an empty body): fall back to a general message.
  }
  const err = (payload as { error?: { code?: unknown; message?: unknown; details?: unknown } } | null)?.error;
  if (err && typeof err.message === "string") {
    return new ApiError(res.status, typeof err.code === "string" ? err.code : "error", err.message, err.details);
  }
  return new ApiError(res.status, res.status === 404 ? "not_found" : "http_error", UNKNOWN_MESSAGE);
}

async function send(
  method: string,
  path: string,
  options: RequestOptions,
  token: string | null,
  idempotencyKey?: string,
): Promise<Response> {
  const headers: Record<string, string> = { Accept: "application/json" };
  if (idempotencyKey) headers["Idempotency-Key"] = idempotencyKey;
  // Multipart bodies go as they are: the browser sets the Content-Type with its boundary.
  const multipart = typeof FormData !== "undefined" && options.body instanceof FormData;
  if (options.body !== undefined && !multipart) headers["Content-Type"] = "application/json";
  if (token) headers["X-CSRF-Token"] = token;
  // The server writes a signed-out or tenant's error messages in this language. Read from <html lang>
  // (the tenant shell sets it with the chosen language; staff pages stay "en-GB"), so this module never
  // needs i18next, which staff never load.
  const language = typeof document === "undefined" ? "" : document.documentElement.lang;
  if (language) headers["Accept-Language"] = language;
  try {
    return await fetch(apiUrl(path, options.query), {
      method,
      headers,
      credentials: "same-origin",
      body: options.body === undefined ? undefined : multipart ? (options.body as FormData) : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (e) {
    if (e instanceof DOMException && e.name === "AbortError") throw e;
    throw new ApiError(0, "network_error", NETWORK_MESSAGE);
  }
}

/**
 * A POST sent again with the same key after a network failure or a 502/503/504: the server answers a
 * repeat with the first answer (or says it was already saved), so a failover mid-submit neither
 * loses the submission nor makes it twice. Other methods are sent once.
 */
async function sendWithRetries(
  method: string,
  path: string,
  options: RequestOptions,
  token: string | null,
  idempotencyKey?: string,
): Promise<Response> {
  for (let attempt = 0; ; attempt++) {
    const last = !idempotencyKey || attempt >= POST_RETRY_DELAYS_MS.length;
    try {
      const res = await send(method, path, options, token, idempotencyKey);
      if (last || !RETRY_STATUSES.has(res.status)) return res;
    } catch (error) {
      if (last || !(error instanceof ApiError)) throw error;
    }
    await pause(POST_RETRY_DELAYS_MS[attempt]!, options.signal);
  }
}

async function request<T>(method: string, path: string, options: RequestOptions): Promise<T> {
  const unsafe = UNSAFE_METHODS.has(method);
  // One key per call: a call is one form submission, and every retry of it carries the same key.
  const idempotencyKey = method === "POST" ? (options.idempotencyKey ?? newIdempotencyKey()) : undefined;
  let res = await sendWithRetries(method, path, options, unsafe ? await getCsrfToken() : null, idempotencyKey);

  if (!res.ok && unsafe && res.status === 403) {
    const error = await toApiError(res);
    if (error.code !== "csrf_invalid") throw error;
    // The session (and its token) may have changed since we cached it: fetch once more, retry once.
    // The request was refused, so nothing was done: the same key is still right.
    clearCsrfToken();
    res = await sendWithRetries(method, path, options, await getCsrfToken(), idempotencyKey);
  }

  if (!res.ok) throw await toApiError(res);
  if (res.status === 204 || res.headers.get("Content-Length") === "0") return undefined as T;
  const text = await res.text();
  if (!text) return undefined as T;
  try {
    return JSON.parse(text) as T;
  } catch {
    throw new ApiError(res.status, "invalid_response", UNKNOWN_MESSAGE);
  }
}

export const api = {
  get: <T>(path: string, options: Omit<RequestOptions, "body"> = {}) => request<T>("GET", path, options),
  post: <T>(path: string, body?: unknown, options: Omit<RequestOptions, "body"> = {}) =>
    request<T>("POST", path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options: Omit<RequestOptions, "body"> = {}) =>
    request<T>("PUT", path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options: Omit<RequestOptions, "body"> = {}) =>
    request<T>("PATCH", path, { ...options, body }),
  delete: <T>(path: string, options: Omit<RequestOptions, "body"> = {}) => request<T>("DELETE", path, options),
};

/** The message to show a person for any thrown value. */
export function errorMessage(error: unknown, fallback = UNKNOWN_MESSAGE): string {
  if (error instanceof ApiError) {
    // A 400 names the field first ("token: This link is not valid."); the detail reads better.
    const first = error.status === 400 ? error.fieldErrors[0] : undefined;
    return first?.message ?? error.message;
  }
  return fallback;
}
