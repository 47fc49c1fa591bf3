// The OpenAPI 3.1 document of the whole API, built from the contract's response schemas and the
// routes' request schemas (api-registry.ts) with zod 4's own z.toJSONSchema.
import { z } from "zod";
import { API_SCOPES, errorResponse, isJsonSchema, scopeOf } from "../../../src/lib/contracts/index.js";
import {
  WEBHOOK_EVENT_TYPES,
  WEBHOOK_PAYLOADS,
  WEBHOOK_TEST_EVENT,
  webhookTestPayload,
} from "../../../src/lib/contracts/webhooks.js";
import { ATTEMPT_HEADER, EVENT_ID_HEADER, EVENT_TYPE_HEADER, SIGNATURE_HEADER } from "../webhooks/webhook-signature.js";
import { ROUTES } from "./api-registry.js";

const json = (schema: z.ZodType, io: "input" | "output") =>
  z.toJSONSchema(schema, { target: "draft-2020-12", io, unrepresentable: "any" });
const oapiPath = (path: string) => path.replace(/:([A-Za-z]+)/g, "{$1}");
const who = (access: (typeof ROUTES)[number]["access"]) =>
  access === "public"
    ? "Anyone, no sign-in."
    : access === "signed-in"
      ? "Anyone signed in (tenants see only their home's data)."
      : "apiKey" in access
        ? `An API key with the scope ${access.apiKey} (Authorization: Bearer dwk_…); no session, no CSRF token.`
        : `Roles: ${access.join(", ")}.`;

const WEBHOOK_HEADERS = [
  {
    name: SIGNATURE_HEADER,
    in: "header",
    required: true,
    description:
      "`t=<unix seconds>,v1=<hex>`: v1 is the HMAC-SHA256 of `<t>.<raw body>` keyed with the endpoint's signing secret. " +
      "For 24 hours after the secret is replaced a second v1= carries the old secret's signature; accept the request if any matches. " +
      "Refuse a t more than 5 minutes from your clock (a replay), compare in constant time, and compute over the raw bytes, not re-serialised JSON.",
    schema: { type: "string", pattern: "^t=[0-9]+(,v1=[0-9a-f]{64})+$" },
  },
  {
    name: EVENT_ID_HEADER,
    in: "header",
    required: true,
    description: "The event's id (the body's `id`), the same on every attempt and every \"send again\": de-duplicate by it.",
    schema: { type: "string", format: "uuid" },
  },
  { name: EVENT_TYPE_HEADER, in: "header", required: true, description: "The body's `type`.", schema: { type: "string" } },
  {
    name: ATTEMPT_HEADER,
    in: "header",
    required: true,
    description: '1, 2, … (counted again from 1 after "send again").',
    schema: { type: "integer", minimum: 1 },
  },
];

/** One webhook operation (OpenAPI 3.1 `webhooks`): what Dewline POSTs to an endpoint for this event type. */
function webhookOperation(type: string, schema: z.ZodType) {
  return {
    post: {
      summary: type,
      description: schema.description ?? type,
      operationId: `webhook:${type}`,
      parameters: WEBHOOK_HEADERS,
      requestBody: { required: true, content: { "application/json": { schema: json(schema, "output") } } },
      responses: {
        "2XX": {
          description:
            "Received. Answer within 10 seconds; anything else (no answer, a redirect, 4xx, 5xx) is retried with backoff.",
        },
      },
    },
  };
}

/** Every event type the code can send, from the contract's own list: a new type without a payload does not compile. */
export function webhookOperations() {
  return {
    ...Object.fromEntries(WEBHOOK_EVENT_TYPES.map((type) => [type, webhookOperation(type, WEBHOOK_PAYLOADS[type])])),
    [WEBHOOK_TEST_EVENT]: webhookOperation(WEBHOOK_TEST_EVENT, webhookTestPayload),
  };
}

export function fullOpenApiDocument(serverUrl: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of ROUTES) {
    const params = [...r.path.matchAll(/:([A-Za-z]+)/g)].map((m) => ({
      name: m[1],
      in: "path",
      required: true,
      schema: { type: "string" },
    }));
    const query = r.query
      ? Object.entries((json(r.query, "input").properties ?? {}) as Record<string, unknown>).map(([name, schema]) => ({
          name,
          in: "query",
          required: false,
          schema,
        }))
      : [];
    const bodies = r.body === undefined ? [] : Array.isArray(r.body) ? (r.body as z.ZodType[]) : [r.body as z.ZodType];
    const bodySchema =
      bodies.length === 0
        ? undefined
        : bodies.length === 1
          ? json(bodies[0]!, "input")
          : { oneOf: bodies.map((b) => json(b, "input")) };
    const mediaType = r.multipart ? "multipart/form-data" : "application/json";
    const success =
      r.response === null
        ? { description: "Done, no body." }
        : isJsonSchema(r.response)
          ? { description: "Success.", content: { "application/json": { schema: json(r.response, "output") } } }
          : { description: "Success.", content: { [r.response.mediaType]: {} } };
    const scope = scopeOf(r);
    // Every POST takes an Idempotency-Key (server/middleware/idempotency.ts); sensors' ingest accepts
    // it but needs none: a reading is stored once per sensor and time whatever is sent again.
    const headers =
      r.method === "POST"
        ? [
            {
              $ref: r.path.startsWith("/sensor-ingest")
                ? "#/components/parameters/IdempotencyKeyIgnored"
                : "#/components/parameters/IdempotencyKey",
            },
          ]
        : [];
    const parameters = [...params, ...query, ...headers];
    paths[oapiPath(r.path)] ??= {};
    paths[oapiPath(r.path)]![r.method.toLowerCase()] = {
      summary: r.summary,
      description: who(r.access),
      "x-dewline-access": r.access,
      // Session routes use the session cookie; the integration API a key with the route's scope.
      security: scope ? [{ apiKey: [scope] }] : [{ session: [] }],
      ...(parameters.length > 0 ? { parameters } : {}),
      ...(bodySchema || r.multipart
        ? { requestBody: { required: true, content: { [mediaType]: { schema: bodySchema ?? { type: "object" } } } } }
        : {}),
      responses: {
        [String(r.status)]: success,
        default: {
          description: scope
            ? "An error: 400 names the field, 401 unknown or revoked key, 403 the key lacks the scope (named), 404 not found or not yours, 429 over the key's rate limit (Retry-After)."
            : "An error: 400 names the field, 401 not signed in, 403 not allowed or bad CSRF token, 404 not found or not yours.",
          content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } },
        },
      },
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Dewline API",
      version: "1.0.0",
      description:
        "Every route of the Dewline API. Session routes: state-changing requests carry the session's CSRF token in X-CSRF-Token (GET /api/auth/csrf). The integration API (/api/v1) takes an API key an admin created, as `Authorization: Bearer dwk_…`, and each route needs the scope it names. Staff only.\n\n" +
        "Idempotency: send `Idempotency-Key: <a new UUID>` with each POST, and the same key when you send that POST again after a timeout, a dropped connection or a 502/503/504. A repeat with a key already used for a write gets the first answer again (same status and body, header `Idempotent-Replayed: true`) and creates nothing; the same key with another method, path or body is a 422 (`idempotency_key_reused`); a 409 `already_applied` means the first attempt was saved but its answer was not kept (it failed after saving, or it carried a secret shown only once): look the result up instead of sending again. Keys are per user (per API key on /api/v1) and kept for 24 hours.\n\n" +
        "Webhooks: an admin registers an endpoint (POST /api/webhooks) for the event types it wants; each event is POSTed to it as JSON with the headers below, signed with the endpoint's own secret, retried with backoff until it answers 2xx (at least once: de-duplicate by Dewline-Event-Id). To verify a delivery, take the raw body, refuse a timestamp more than 5 minutes off, and compare HMAC-SHA256 of `<t>.<raw body>` with each v1 in constant time.",
    },
    servers: [{ url: serverUrl }],
    paths,
    webhooks: webhookOperations(),
    components: {
      schemas: { Error: json(errorResponse, "output") },
      parameters: {
        IdempotencyKey: {
          name: "Idempotency-Key",
          in: "header",
          required: false,
          description:
            "A new key (a UUID) for each submission, the same one when sending it again: a repeat creates nothing twice and gets the first answer. 1–100 visible ASCII characters; kept 24 hours.",
          schema: { type: "string", minLength: 1, maxLength: 100, pattern: "^[\\x21-\\x7E]{1,100}$" },
        },
        IdempotencyKeyIgnored: {
          name: "Idempotency-Key",
          in: "header",
          required: false,
          description:
            "Accepted and not needed: a reading is stored once per sensor and time, so a batch sent again adds nothing.",
          schema: { type: "string", maxLength: 100 },
        },
      },
      securitySchemes: {
        session: { type: "apiKey", in: "cookie", name: "dewline.sid" },
        apiKey: {
          type: "http",
          scheme: "bearer",
          bearerFormat: "dwk_<id>_<secret>",
          description: `An API key from Integrations → API keys. Scopes: ${API_SCOPES.join(", ")}.`,
        },
      },
    },
  };
}
