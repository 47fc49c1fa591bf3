import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ConversationResponse } from "@/lib/contracts";
import { conversationKeys } from "@/lib/query-keys";

interface ReadMark {
  unread: number;
  readUpTo: number | null;
}

/** POST /api/cases/:id/messages/read: read up to the newest message shown (never further). */
export const markConversationRead = (caseId: number, upTo: number) =>
  api.post<ReadMark>(`/cases/${caseId}/messages/read`, { upTo });

export function useMarkRead(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: conversationKeys.read(caseId),
    mutationFn: (upTo: number) => markConversationRead(caseId, upTo),
    onSuccess: (mark) => {
      queryClient.setQueryData<ConversationResponse>(conversationKeys.thread(caseId), (old) => (old ? { ...old, ...mark } : old));
      void queryClient.invalidateQueries({ queryKey: conversationKeys.unread() });
    },
  });
}
