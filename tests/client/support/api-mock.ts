import { vi } from "vitest";

export interface MockReply {
  status?: number;
  body?: unknown;
  headers?: Record<string, string>;
}

export interface RecordedCall {
  method: string;
  path: string;
  search: URLSearchParams;
  headers: Headers;
  body: unknown;
}

type Handler = MockReply | ((call: RecordedCall, nth: number) => MockReply);

/**
 * Stubs global fetch with canned API replies keyed by "METHOD /api/path" (no query string).
 * Unknown routes answer 404 in the server's error shape, so a missing stub shows up as an error.
 */
export function mockApi(routes: Record<string, Handler>) {
  const calls: RecordedCall[] = [];
  const counts = new Map<string, number>();
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(typeof input === "string" ? input : input instanceof URL ? input.href : input.url, "http://localhost");
    const method = (init.method ?? "GET").toUpperCase();
    const call: RecordedCall = {
      method,
      path: url.pathname,
      search: url.searchParams,
      headers: new Headers(init.headers),
      body: typeof init.body === "string" ? JSON.parse(init.body) : undefined,
    };
    calls.push(call);
    const key = `${method} ${url.pathname}`;
    const nth = counts.get(key) ?? 0;
    counts.set(key, nth + 1);
    const handler = routes[key];
    const reply: MockReply = handler
      ? typeof handler === "function"
        ? handler(call, nth)
        : handler
      : { status: 404, body: { error: { code: "not_found", message: `There is no API route ${key}.` } } };
    const status = reply.status ?? 200;
    const hasBody = reply.body !== undefined && status !== 204;
    return new Response(hasBody ? JSON.stringify(reply.body) : null, {
      status,
      headers: { ...(hasBody ? { "Content-Type": "application/json" } : {}), ...reply.headers },
    });
  });
  vi.stubGlobal("fetch", fetchMock);
  return {
    fetchMock,
    calls,
    callsTo: (method: string, path: string) => calls.filter((c) => c.method === method && c.path === path),
  };
}

export const apiError = (status: number, code: string, message: string, details?: unknown): MockReply => ({
  status,
  body: { error: { code, message, ...(details !== undefined ? { details } : {}) } },
});

export const unauthenticated = apiError(401, "unauthorised", "Please sign in to continue.");

export const users = {
  tenant: { id: 11, email: "tenant@example.org", name: "Robin Ashdown", role: "tenant", organisationId: 1 },
  officer: { id: 2, email: "officer@example.org", name: "Priya Venn", role: "officer", organisationId: 1 },
  maintenance: { id: 3, email: "maintenance@example.org", name: "Dale Whitcombe", role: "maintenance", organisationId: 1 },
  admin: { id: 1, email: "admin@example.org", name: "Morgan Castell", role: "admin", organisationId: 1 },
} as const;

export function makeProperty(id: number, overrides: Record<string, unknown> = {}) {
  return {
    id,
    addressLine1: `Flat ${id}, Falcon House`,
    addressLine2: "Kestrel Rise",
    town: "Easterby",
    postcode: `ZX5 ${id}AB`,
    uprn: String(990000100000 + id),
    estate: "Kestrel Rise",
    block: "Falcon House",
    builtForm: "flat",
    wallType: "system-built",
    glazingType: "old-double",
    heatingType: "gas-boiler",
    ...overrides,
  };
}

/** A page of properties as GET /api/properties answers it. */
export function propertyPage(search: URLSearchParams, total = 60) {
  const page = Number(search.get("page") ?? 1);
  const pageSize = Number(search.get("pageSize") ?? 25);
  const start = (page - 1) * pageSize;
  const items = Array.from({ length: Math.max(0, Math.min(pageSize, total - start)) }, (_, i) => makeProperty(start + i + 1));
  return { items, total, page, pageSize };
}
