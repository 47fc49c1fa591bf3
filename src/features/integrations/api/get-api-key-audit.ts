import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ApiKeyAuditResponse } from "@/lib/contracts";
import { apiKeyKeys } from "@/lib/query-keys";

/** GET /api/integrations/api-keys/audit: the latest writes made with the landlord's keys. */
export const getApiKeyAudit = (signal?: AbortSignal) => api.get<ApiKeyAuditResponse>("/integrations/api-keys/audit", { signal });

export const apiKeyAuditQueryOptions = () =>
  queryOptions({ queryKey: apiKeyKeys.audit(), queryFn: ({ signal }) => getApiKeyAudit(signal) });

export function useApiKeyAudit() {
  return useQuery(apiKeyAuditQueryOptions());
}
