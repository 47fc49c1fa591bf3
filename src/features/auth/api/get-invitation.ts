import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { InvitationDescription } from "@/lib/contracts";
import { authKeys } from "@/lib/query-keys";

export type { InvitationDescription };

export const getInvitation = (token: string, signal?: AbortSignal) =>
  api.get<InvitationDescription>(`/auth/invitations/${encodeURIComponent(token)}`, { signal });

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: ({ signal }) => getInvitation(token, signal),
    staleTime: Infinity,
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
