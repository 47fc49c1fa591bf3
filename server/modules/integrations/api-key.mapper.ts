import type { z } from "zod";
import type { apiKeyAuditEntry, apiKeyCreatedResponse, apiKeyResponse } from "../../../src/lib/contracts/integrations.js";
import type { Person } from "../users/user.service.js";
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
