import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { webhookKeys } from "@/lib/query-keys";

/** DELETE /api/webhooks/:id: the endpoint goes, with its deliveries. */
export const deleteWebhook = (id: number) => api.delete<null>(`/webhooks/${id}`);

export function useDeleteWebhook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteWebhook,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: webhookKeys.all }),
  });
}
