import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { AdminActionListResponse, AdminActionSubject } from "@/lib/contracts";
import { adminActionKeys } from "@/lib/query-keys";

/** GET /api/integrations/admin-actions: what admins changed in API keys and webhook endpoints, newest first. */
export const getAdminActions = (subject: AdminActionSubject | undefined, signal?: AbortSignal) =>
  api.get<AdminActionListResponse>("/integrations/admin-actions", { signal, query: { subject } });

export const adminActionsQueryOptions = (subject?: AdminActionSubject) =>
  queryOptions({
    queryKey: adminActionKeys.list(subject ?? "all"),
    queryFn: ({ signal }) => getAdminActions(subject, signal),
  });

export function useAdminActions(subject?: AdminActionSubject) {
  return useQuery(adminActionsQueryOptions(subject));
}
