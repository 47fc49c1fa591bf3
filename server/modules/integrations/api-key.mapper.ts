import type { z } from "zod";
import {
  adminActionSubjectOf,
  type adminActionEntry,
  type apiKeyAuditEntry,
  type apiKeyCreatedResponse,
  type apiKeyResponse,
} from "../../../src/lib/contracts/integrations.js";
import type { Person } from "../users/user.service.js";
import type { AdminActionEntry } from "./admin-action.service.js";
import { keyHint, type ApiKey, type ApiKeyAuditEntry } from "./api-key.service.js";

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export const toApiKeyDto = (k: ApiKey, people: Map<number, Person>): z.input<typeof apiKeyResponse> => {
  const by = people.get(k.createdByUserId);
  return {
    id: k.id,
    name: k.name,
    scopes: k.scopes,
    hint: keyHint(k),
    createdAt: k.createdAt.toISOString(),
    createdBy: by ? { id: by.id, name: by.name } : null,
    lastUsedAt: iso(k.lastUsedAt),
    revokedAt: iso(k.revokedAt),
  };
};

export const toApiKeyCreatedDto = (k: ApiKey, creator: Person, secret: string): z.input<typeof apiKeyCreatedResponse> => ({
  ...toApiKeyDto(k, new Map([[creator.id, creator]])),
  secret,
});

export const toApiKeyAuditDto = (e: ApiKeyAuditEntry, names: Map<number, string>): z.input<typeof apiKeyAuditEntry> => ({
  id: Number(e.id),
  key: { id: e.apiKeyId, name: names.get(e.apiKeyId) ?? `Key ${e.apiKeyId}` },
  method: e.method,
  path: e.path,
  status: e.status,
  at: e.createdAt.toISOString(),
});

export const toAdminActionDto = (e: AdminActionEntry, people: Map<number, Person>): z.input<typeof adminActionEntry> => {
  const by = people.get(e.actorUserId);
  return {
    id: Number(e.id),
    action: e.action,
    subject: { kind: adminActionSubjectOf(e.action), id: e.subjectId },
    detail: e.detail,
    by: by ? { id: by.id, name: by.name } : null,
    at: e.createdAt.toISOString(),
  };
};
