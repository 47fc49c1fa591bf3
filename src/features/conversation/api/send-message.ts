import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { PhotoResponse } from "@/lib/contracts";
import { caseKeys, conversationKeys } from "@/lib/query-keys";

export type OutgoingMessage =
  /** A tenant to the landlord; the photos go through the case's one photo upload first. */
  | { viewer: "tenant"; body: string; photos: readonly File[] }
  /** Staff to the tenant (e-mailed to them), or an internal note only staff see. */
  | { viewer: "staff"; body: string; internal: boolean };

/** POST /api/cases/:id/photos (multipart, field `photos`), as every other photo of the case. */
const uploadCasePhotos = (caseId: number, files: readonly File[]) => {
  const form = new FormData();
  for (const file of files) form.append("photos", file, file.name);
  return api.post<{ photos: PhotoResponse[] }>(`/cases/${caseId}/photos`, form);
};

/** Sends one message: photos (tenants) are uploaded to the case first, then the message refers to them. */
export async function sendMessage(caseId: number, message: OutgoingMessage): Promise<{ id: number; photoCount: number }> {
  if (message.viewer === "staff") {
    const sent = await api.post<{ ok: true; id: number }>(`/cases/${caseId}/messages`, {
      body: message.body,
      internal: message.internal,
    });
    return { id: sent.id, photoCount: 0 };
  }
  const photoIds = message.photos.length ? (await uploadCasePhotos(caseId, message.photos)).photos.map((p) => p.id) : [];
  const sent = await api.post<{ ok: true; id: number }>(`/cases/${caseId}/messages`, { body: message.body, photoIds });
  return { id: sent.id, photoCount: photoIds.length };
}

export function useSendMessage(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: conversationKeys.send(caseId),
    mutationFn: (message: OutgoingMessage) => sendMessage(caseId, message),
    onSettled: (_result, _error, message) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: conversationKeys.thread(caseId) }),
        queryClient.invalidateQueries({ queryKey: caseKeys.events(caseId) }),
        queryClient.invalidateQueries({ queryKey: conversationKeys.unread() }),
        message.viewer === "tenant" && message.photos.length
          ? queryClient.invalidateQueries({ queryKey: caseKeys.photos(caseId) })
          : null,
      ]),
  });
}
