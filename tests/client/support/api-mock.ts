import { expect, vi } from "vitest";
import type { z } from "zod";
import { endpointFor, errorResponse, isJsonSchema } from "@/lib/contracts";

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

/** Every misfit of every mockApi in the running test; tests/setup/client-setup.ts fails the test on any. */
const allMisfits: Error[] = [];
export function takeMockMisfits(): Error[] {
  return allMisfits.splice(0);
}

/** Why a canned body does not fit a schema, or null when it does (path: message, one per line). */
function misfit(schema: z.ZodType, value: unknown): string | null {
  const result = schema.safeParse(value);
  return result.success ? null : result.error.issues.map((i) => `${i.path.join(".") || "(body)"}: ${i.message}`).join("\n");
}

/**
 * A fixture built as the API contract (src/lib/contracts) says the server answers: fails the test when
 * it does not fit, and returns it as the client will see it (unknown fields dropped, as the type says).
 */
export function mockReply<S extends z.ZodType>(schema: S, value: z.input<S>): z.output<S> {
  const result = schema.safeParse(value);
  expect(result.success ? null : misfit(schema, value), "the mocked reply fits the API contract").toBeNull();
  return result.data as z.output<S>;
}

/**
 * Checks one canned reply against the contract: a success with the route's schema (the route must be
 * in ENDPOINTS), an error with the server's error shape. Throws, so the test fails, naming the field.
 */
export function checkReply(method: string, path: string, reply: MockReply): void {
  const status = reply.status ?? 200;
  const endpoint = endpointFor(method, path);
  if (!endpoint)
    throw new Error(`Mocked reply for ${method} ${path}: the API contract has no such route (src/lib/contracts/endpoints.ts).`);
  if (status >= 400) {
    const why = misfit(errorResponse, reply.body);
    if (why) throw new Error(`Mocked error for ${method} ${path} is not in the server's error shape:\n${why}`);
    return;
  }
  if (status === 204 || endpoint.response === null) return;
  if (!isJsonSchema(endpoint.response)) return;
  const why = misfit(endpoint.response, reply.body);
  if (why) throw new Error(`Mocked reply for ${method} ${path} does not fit the API contract:\n${why}`);
}

/**
 * Stubs global fetch with canned API replies keyed by "METHOD /api/path" (no query string). Every
 * reply is checked against the API contract first (checkReply), so a mock cannot say what the
 * server never would. Unknown routes answer 404 in the server's error shape, so a missing stub
 * shows up as an error.
 */
export function mockApi(routes: Record<string, Handler>) {
  const calls: RecordedCall[] = [];
  const misfits: Error[] = [];
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
    if (handler) {
      try {
        checkReply(method, url.pathname, reply);
      } catch (error) {
        misfits.push(error as Error);
        allMisfits.push(error as Error);
        throw error;
      }
    }
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
    /** Replies that did not fit the contract (each also rejected its fetch). */
    misfits,
    callsTo: (method: string, path: string) => calls.filter((c) => c.method === method && c.path === path),
  };
}

export const apiError = (status: number, code: string, message: string, details?: unknown): MockReply => ({
  status,
  body: { error: { code, message, ...(details !== undefined ? { details } : {}) } },
});

export const unauthenticated = apiError(401, "unauthorised", "Please sign in to continue.");

export const users = {
  tenant: { id: 11, email: "tenant@example.org", name: "Robin Ashdown", role: "tenant", organisationId: 1, language: null },
  officer: { id: 2, email: "officer@example.org", name: "Priya Venn", role: "officer", organisationId: 1, language: null },
  maintenance: {
    id: 3,
    email: "maintenance@example.org",
    name: "Dale Whitcombe",
    role: "maintenance",
    organisationId: 1,
    language: null,
  },
  admin: { id: 1, email: "admin@example.org", name: "Morgan Castell", role: "admin", organisationId: 1, language: null },
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
    ventilation: "not-recorded",
    builtYear: null,
    ageBand: null,
    wallInsulation: null,
    roofInsulationMm: null,
    heatingFuel: null,
    hasExtractFans: null,
    hasTrickleVents: null,
    floorAreaM2: null,
    epcBand: null,
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
