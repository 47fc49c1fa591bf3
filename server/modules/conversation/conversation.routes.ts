import { Router } from "express";
import { messageSentResponse, readMarkResponse, unreadMessagesResponse } from "../../../src/lib/contracts/conversation.js";
import { markReadSchema, staffMessageSchema, tenantMessageSchema } from "../../../src/lib/schemas/messages.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth } from "../../middleware/auth.js";
import { isStaff } from "../auth/actor.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { ConversationService } from "./conversation.service.js";
import { toConversationDto } from "./conversation.mapper.js";

/** Mounted at /api/cases: the conversation on a case, for its tenant and the landlord's staff alike. */
export function createConversationRouter({ conversation }: { conversation: ConversationService }): Router {
  const router = Router();

  router.get("/:id/messages", requireAuth, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(toConversationDto(await conversation.conversation(actorOf(req), id)));
  });

  router.post("/:id/messages", requireAuth, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const actor = actorOf(req);
    const messageId = isStaff(actor)
      ? await conversation.postAsStaff(actor, id, parse(staffMessageSchema, req.body))
      : await conversation.postAsTenant(actor, id, parse(tenantMessageSchema, req.body));
    res.status(201).json(shaped(messageSentResponse, { ok: true, id: messageId }));
  });

  router.post("/:id/messages/read", requireAuth, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { upTo } = parse(markReadSchema, req.body);
    res.json(shaped(readMarkResponse, await conversation.markRead(actorOf(req), id, upTo)));
  });

  return router;
}

/** Mounted at /api/me: `GET /unread-messages`, the asker's cases with messages they have not read. */
export function createMyUnreadRouter({ conversation }: { conversation: ConversationService }): Router {
  const router = Router();
  router.get("/unread-messages", requireAuth, async (req, res) => {
    const items = await conversation.unreadCases(actorOf(req));
    res.json(
      shaped(unreadMessagesResponse, {
        items: items.map((i) => ({ ...i, latestAt: i.latestAt.toISOString() })),
        total: items.reduce((n, i) => n + i.unread, 0),
      }),
    );
  });
  return router;
}
