// The OpenAPI 3.1 document of the whole API, built from the contract's response schemas and the
// routes' request schemas (api-registry.ts) with zod 4's own z.toJSONSchema.
import { z } from "zod";
import { API_SCOPES, errorResponse, isJsonSchema, scopeOf } from "../../../src/lib/contracts/index.js";
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
    paths[oapiPath(r.path)] ??= {};
    paths[oapiPath(r.path)]![r.method.toLowerCase()] = {
      summary: r.summary,
      description: who(r.access),
      "x-dewline-access": r.access,
      // Session routes use the session cookie; the integration API a key with the route's scope.
      security: scope ? [{ apiKey: [scope] }] : [{ session: [] }],
      ...(params.length + query.length > 0 ? { parameters: [...params, ...query] } : {}),
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
        "Every route of the Dewline API. Session routes: state-changing requests carry the session's CSRF token in X-CSRF-Token (GET /api/auth/csrf). The integration API (/api/v1) takes an API key an admin created, as `Authorization: Bearer dwk_…`, and each route needs the scope it names. Staff only.",
    },
    servers: [{ url: serverUrl }],
    paths,
    components: {
      schemas: { Error: json(errorResponse, "output") },
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
