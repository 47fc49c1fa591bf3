// Small HTTP helpers for the load and fault scripts: a signed-in session kept by hand (cookie and
// CSRF token, like the browser client), and autocannon with the part of its API we use typed.
import { createRequire } from "node:module";

export interface LoadResult {
  requests: number;
  /** Answers other than 2xx, plus connection errors and timeouts. */
  errors: number;
  rps: number;
  p50: number;
  p99: number;
}

interface AutocannonResult {
  duration: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  requests: { average: number; total: number };
  latency: { p50: number; p99: number };
}
type Autocannon = (options: Record<string, unknown>, done: (error: Error | null, result: AutocannonResult) => void) => unknown;
// autocannon ships no type declarations; this is the part of its API used here.
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

export interface LoadRequest {
  method: "GET" | "POST";
  path: string;
  body?: string;
}

/** Runs autocannon against `base` for `seconds`, each connection cycling through `requests`. */
export function load(
  base: string,
  requests: LoadRequest[],
  options: { seconds: number; connections: number; headers?: Record<string, string> },
): Promise<LoadResult> {
  return new Promise((resolve, reject) => {
    autocannon(
      {
        url: base,
        connections: options.connections,
        duration: options.seconds,
        timeout: 30,
        headers: { "content-type": "application/json", ...options.headers },
        requests: requests.map((r) => ({ method: r.method, path: r.path, body: r.body })),
      },
      (error, r) =>
        error
          ? reject(error)
          : resolve({
              requests: r.requests.total,
              errors: r.non2xx + r.errors + r.timeouts,
              rps: r.requests.total / r.duration,
              p50: r.latency.p50,
              p99: r.latency.p99,
            }),
    );
  });
}

/** A signed-in user over plain fetch: the session cookie and the CSRF token sent as the client does. */
export class Session {
  cookie = "";
  csrf = "";
  constructor(readonly base: string) {}

  private keep(res: Response) {
    const set = res.headers.getSetCookie().find((c) => c.startsWith("dewline.sid="));
    if (set) this.cookie = set.split(";")[0]!;
  }

  get headers(): Record<string, string> {
    return { cookie: this.cookie, "x-csrf-token": this.csrf };
  }

  static async signIn(base: string, email: string, password: string): Promise<Session> {
    const s = new Session(base);
    const csrf = await fetch(`${base}/api/auth/csrf`);
    s.keep(csrf);
    s.csrf = ((await csrf.json()) as { csrfToken: string }).csrfToken;
    const res = await s.request("POST", "/api/auth/login", { email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
    s.csrf = ((await res.json()) as { csrfToken: string }).csrfToken;
    return s;
  }

  /** A JSON request (or a FormData one) with the session; rejects only when no answer came. */
  async request(method: string, path: string, body?: unknown, timeoutMs = 30_000): Promise<Response> {
    const form = body instanceof FormData;
    const res = await fetch(`${this.base}${path}`, {
      method,
      headers: form ? this.headers : { ...this.headers, "content-type": "application/json" },
      body: body === undefined ? undefined : form ? body : JSON.stringify(body),
      signal: AbortSignal.timeout(timeoutMs),
    });
    this.keep(res);
    return res;
  }
}

/** The value at quantile q (0–1) of the numbers, by nearest rank. */
export function quantile(values: number[], q: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
}

/** Prints rows of figures as an aligned table under a title. */
export function printTable(title: string, rows: Record<string, string | number>[]): void {
  console.log(`\n${title}`);
  if (rows.length === 0) return;
  const cols = Object.keys(rows[0]!);
  const cell = (v: string | number | undefined) =>
    typeof v === "number" ? (Number.isInteger(v) ? String(v) : v.toFixed(v < 10 ? 2 : 1)) : (v ?? "");
  const widths = cols.map((c) => Math.max(c.length, ...rows.map((r) => cell(r[c]).length)));
  const line = (values: string[]) => "  " + values.map((v, i) => v.padStart(widths[i]!)).join("  ");
  console.log(line(cols));
  for (const r of rows) console.log(line(cols.map((c) => cell(r[c]))));
}
