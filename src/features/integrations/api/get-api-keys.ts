import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ApiKeyListResponse } from "@/lib/contracts";
import { apiKeyKeys } from "@/lib/query-keys";

/** GET /api/integrations/api-keys: the landlord's keys, newest first (never their secrets). */
export const getApiKeys = (signal?: AbortSignal) => api.get<ApiKeyListResponse>("/integrations/api-keys", { signal });

export const apiKeysQueryOptions = () =>
  queryOptions({ queryKey: apiKeyKeys.list(), queryFn: ({ signal }) => getApiKeys(signal) });

export function useApiKeys() {
  return useQuery(apiKeysQueryOptions());
}
