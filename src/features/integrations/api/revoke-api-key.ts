import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ApiKeyResponse } from "@/lib/contracts";
import { adminActionKeys, apiKeyKeys } from "@/lib/query-keys";

/** POST /api/integrations/api-keys/:keyId/revoke: refused from now on. */
export const revokeApiKey = (keyId: number) => api.post<ApiKeyResponse>(`/integrations/api-keys/${keyId}/revoke`);

export function useRevokeApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeApiKey,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: apiKeyKeys.list() }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
