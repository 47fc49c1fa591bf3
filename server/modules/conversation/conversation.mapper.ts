import type { z } from "zod";
import type { conversationResponse } from "../../../src/lib/contracts/conversation.js";
import type { ConversationEntry, ReadState } from "./conversation.service.js";

export const toConversationDto = ({
  entries,
  unread,
  readUpTo,
}: { entries: ConversationEntry[] } & ReadState): z.input<typeof conversationResponse> => ({
  messages: entries.map((e) => ({
    id: e.id,
    kind: e.kind,
    at: e.at.toISOString(),
    author: e.author,
    mine: e.mine,
    body: e.body,
    photos: e.photoIds.map((id) => ({ id, url: `/api/photos/${id}`, thumbnailUrl: `/api/photos/${id}/thumbnail` })),
    readBy: e.readBy.map((r) => ({ name: r.name, role: r.role, readAt: r.readAt.toISOString() })),
  })),
  unread,
  readUpTo,
});
