import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshCaseWork } from "./refresh-case";
import { caseKeys } from "@/lib/query-keys";

export interface MessageInput {
  body: string;
  /** true: an internal note only staff see; false: a message to the tenant, shown on their case page and e-mailed. */
  internal: boolean;
}

export const sendMessage = (id: number, input: MessageInput) => api.post<{ ok: true }>(`/cases/${id}/messages`, input);

export function useSendMessage(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.detail(id), "message"],
    mutationFn: (input: MessageInput) => sendMessage(id, input),
    onSuccess: () => refreshCaseWork(queryClient, id),
  });
}
