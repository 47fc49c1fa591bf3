// API keys for a landlord's other systems (the integration API under /api/v1): what the admin's page
// shows, and the scopes a key can hold.
import { z } from "zod";
import { id, idName, instant } from "./common.js";

/** What a key may do on the integration API; every key route needs exactly one of these. */
export const API_SCOPES = ["homes:read", "homes:write", "cases:read", "cases:write", "works:read"] as const;
export type ApiScope = (typeof API_SCOPES)[number];

export const apiScopeLabels: Record<ApiScope, string> = {
  "homes:read": "Read homes",
  "homes:write": "Add and change homes (by UPRN)",
  "cases:read": "Read cases",
  "cases:write": "Log cases and add readings",
  "works:read": "Read work orders",
};

/** A key as the admin's list shows it: never its secret. */
export const apiKeyResponse = z.object({
  id,
  name: z.string(),
  scopes: z.array(z.enum(API_SCOPES)),
  /** The key's public start ("dwk_12_…"), so an admin can tell which key a system holds. */
  hint: z.string(),
  createdAt: instant,
  createdBy: idName.nullable(),
  lastUsedAt: instant.nullable(),
  revokedAt: instant.nullable(),
});
export type ApiKeyResponse = z.infer<typeof apiKeyResponse>;

/** POST /api/integrations/api-keys: the new key with its secret, the only time it is ever sent. */
export const apiKeyCreatedResponse = apiKeyResponse.extend({ secret: z.string() });
export type ApiKeyCreatedResponse = z.infer<typeof apiKeyCreatedResponse>;

export const apiKeyListResponse = z.object({ keys: z.array(apiKeyResponse) });
export type ApiKeyListResponse = z.infer<typeof apiKeyListResponse>;

/** One write made with a key: which key, which route, the answer's status, when. */
export const apiKeyAuditEntry = z.object({
  id,
  key: idName,
  method: z.string(),
  path: z.string(),
  status: z.number().int(),
  at: instant,
});
export type ApiKeyAuditEntry = z.infer<typeof apiKeyAuditEntry>;
export const apiKeyAuditResponse = z.object({ entries: z.array(apiKeyAuditEntry) });
export type ApiKeyAuditResponse = z.infer<typeof apiKeyAuditResponse>;

/** Changes an admin makes to the landlord's integrations, each recorded with who and when. */
export const ADMIN_ACTION_KINDS = [
  "api-key-created",
  "api-key-revoked",
  "webhook-created",
  "webhook-changed",
  "webhook-removed",
  "webhook-secret-replaced",
] as const;
export type AdminActionKind = (typeof ADMIN_ACTION_KINDS)[number];
/** What the change was made to: an API key or a webhook endpoint. */
export const ADMIN_ACTION_SUBJECTS = ["api-key", "webhook"] as const;
export type AdminActionSubject = (typeof ADMIN_ACTION_SUBJECTS)[number];
export const adminActionSubjectOf = (kind: AdminActionKind): AdminActionSubject =>
  kind.startsWith("api-key-") ? "api-key" : "webhook";

export const adminActionLabels: Record<AdminActionKind, string> = {
  "api-key-created": "API key created",
  "api-key-revoked": "API key revoked",
  "webhook-created": "Webhook endpoint added",
  "webhook-changed": "Webhook endpoint changed",
  "webhook-removed": "Webhook endpoint removed",
  "webhook-secret-replaced": "Webhook signing secret replaced",
};

/** One change an admin made (never a secret): who, what, to which key or endpoint, when. */
export const adminActionEntry = z.object({
  id,
  action: z.enum(ADMIN_ACTION_KINDS),
  subject: z.object({ kind: z.enum(ADMIN_ACTION_SUBJECTS), id }),
  /** The key's name and scopes, the endpoint's address, or the fields changed, as they were then. */
  detail: z.string(),
  by: idName.nullable(),
  at: instant,
});
export type AdminActionEntryDto = z.infer<typeof adminActionEntry>;
export const adminActionListResponse = z.object({ entries: z.array(adminActionEntry) });
export type AdminActionListResponse = z.infer<typeof adminActionListResponse>;
