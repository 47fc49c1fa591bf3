import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ApiKeyCreatedResponse } from "@/lib/contracts";
import { adminActionKeys, apiKeyKeys } from "@/lib/query-keys";
import type { ApiKeyCreateInput } from "@/lib/schemas/api-keys";

export { apiKeyCreateSchema, type ApiKeyCreateInput } from "@/lib/schemas/api-keys";

/** POST /api/integrations/api-keys: the new key, with its secret (this reply is the only time it is sent). */
export const createApiKey = (input: ApiKeyCreateInput) => api.post<ApiKeyCreatedResponse>("/integrations/api-keys", input);

export function useCreateApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createApiKey,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: apiKeyKeys.list() }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
