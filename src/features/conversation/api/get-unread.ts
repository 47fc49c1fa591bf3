import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { UnreadMessagesResponse } from "@/lib/contracts";
import { conversationKeys } from "@/lib/query-keys";

/** GET /api/me/unread-messages: the signed-in person's cases with messages from the other side not read yet. */
export const getUnreadMessages = (signal?: AbortSignal) => api.get<UnreadMessagesResponse>("/me/unread-messages", { signal });

export const unreadMessagesQueryOptions = () =>
  queryOptions({
    queryKey: conversationKeys.unread(),
    queryFn: ({ signal }) => getUnreadMessages(signal),
    refetchInterval: 120_000,
  });

export function useUnreadMessages() {
  return useQuery(unreadMessagesQueryOptions());
}
