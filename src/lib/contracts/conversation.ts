import { z } from "zod";
import { id, instant } from "./common.js";

/**
 * The kinds of entry in a case's conversation: the tenant's messages, staff messages to the tenant,
 * the written summary (a letter to the tenant) and internal notes (staff only, never sent to a tenant).
 */
export const MESSAGE_KINDS = ["from-tenant", "to-tenant", "summary", "internal-note"] as const;
export type MessageKind = (typeof MESSAGE_KINDS)[number];

/** Someone of the other side who has read a message, and when they first did. */
export const messageReader = z.object({ name: z.string(), role: z.string(), readAt: instant });
export type MessageReader = z.infer<typeof messageReader>;

export const conversationMessage = z.object({
  /** The id of the message's event on the case's timeline (GET /api/cases/:id/events). */
  id,
  kind: z.enum(MESSAGE_KINDS),
  at: instant,
  author: z.object({ name: z.string(), role: z.string() }).nullable(),
  /** Written by the person asking. */
  mine: z.boolean(),
  body: z.string(),
  photos: z.array(z.object({ id, url: z.string(), thumbnailUrl: z.string() })),
  /** Staff only (always empty for a tenant): who of the other side has read it, and when they first did. */
  readBy: z.array(messageReader),
});
export type ConversationMessage = z.infer<typeof conversationMessage>;

/** GET /api/cases/:id/messages: the conversation, oldest first, with the asker's unread count and read mark. */
export const conversationResponse = z.object({
  messages: z.array(conversationMessage),
  /** Messages from the other side the asker has not read yet. */
  unread: z.number().int().min(0),
  /** The newest message the asker has read (null: none yet). */
  readUpTo: id.nullable(),
});
export type ConversationResponse = z.infer<typeof conversationResponse>;

/** POST /api/cases/:id/messages. */
export const messageSentResponse = z.object({ ok: z.literal(true), id });

/** POST /api/cases/:id/messages/read. */
export const readMarkResponse = z.object({ unread: z.number().int().min(0), readUpTo: id.nullable() });

/** GET /api/me/unread-messages: the cases with messages from the other side the asker has not read. */
export const unreadCase = z.object({
  caseId: id,
  reference: z.string().nullable(),
  unread: z.number().int().min(1),
  latestAt: instant,
});
export type UnreadCase = z.infer<typeof unreadCase>;
export const unreadMessagesResponse = z.object({ items: z.array(unreadCase), total: z.number().int().min(0) });
export type UnreadMessagesResponse = z.infer<typeof unreadMessagesResponse>;
