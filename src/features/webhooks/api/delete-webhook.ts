import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { adminActionKeys, webhookKeys } from "@/lib/query-keys";

/** DELETE /api/webhooks/:id: the endpoint goes, with its deliveries. */
export const deleteWebhook = (id: number) => api.delete<null>(`/webhooks/${id}`);

export function useDeleteWebhook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteWebhook,
    // The change is on the admins' record of changes too.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: webhookKeys.all }),
        queryClient.invalidateQueries({ queryKey: adminActionKeys.all }),
      ]),
  });
}
