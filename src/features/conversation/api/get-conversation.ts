import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ConversationResponse } from "@/lib/contracts";
import { conversationKeys } from "@/lib/query-keys";

/** GET /api/cases/:id/messages: the thread (oldest first), the unread count and, for staff, who read what. */
export const getConversation = (caseId: number, signal?: AbortSignal) =>
  api.get<ConversationResponse>(`/cases/${caseId}/messages`, { signal });

export const conversationQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: conversationKeys.thread(caseId),
    queryFn: ({ signal }) => getConversation(caseId, signal),
    // A reply may come while the page is open: look again now and then, and when the tab is back in view.
    refetchInterval: 60_000,
  });

export function useConversation(caseId: number) {
  return useQuery(conversationQueryOptions(caseId));
}
