import { Router } from "express";
import { z } from "zod";
import { textChoiceResponse, textOutboxPageResponse } from "../../../src/lib/contracts/sms.js";
import { textChoiceSchema } from "../../../src/lib/schemas/texts.js";
import type { Actor } from "../../lib/actor.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { SMS_STATUSES } from "./outbox-sms.entity.js";
import { toTextOutboxItemDto } from "./sms.mapper.js";
import type { SmsService } from "./sms.service.js";

const textOutboxQuerySchema = z.object({
  status: z.enum(SMS_STATUSES).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, "pageSize can be at most 200.").default(50),
});

/**
 * Text messages: `/api/me/texts` (the tenant's own number and choice), `/api/cases/:id/text-choice`
 * (staff: the case's tenant's) and `/api/text-outbox` (officers and admins: each text's state).
 * `caseTenant` is the cases module's check that the actor may see the case (404 otherwise).
 */
export function createSmsRouter({
  sms,
  caseTenant,
}: {
  sms: SmsService;
  caseTenant: (actor: Actor, caseId: number) => Promise<number | null>;
}): Router {
  const router = Router();

  router.get("/me/texts", requireRole("tenant"), async (req, res) => {
    res.json(shaped(textChoiceResponse, await sms.choiceOf(actorOf(req).id)));
  });

  router.put("/me/texts", requireRole("tenant"), async (req, res) => {
    const input = parse(textChoiceSchema, req.body);
    res.json(shaped(textChoiceResponse, await sms.setOwnChoice(actorOf(req), input)));
  });

  router.get("/cases/:id/text-choice", requireRole("officer", "maintenance", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const tenantUserId = await caseTenant(actorOf(req), id);
    res.json(
      shaped(
        textChoiceResponse,
        tenantUserId === null ? { mobileNumber: null, textsOn: false } : await sms.choiceOf(tenantUserId),
      ),
    );
  });

  router.get("/text-outbox", requireRole("officer", "admin"), async (req, res) => {
    const query = parse(textOutboxQuerySchema, req.query, "query");
    const { items, total } = await sms.list(actorOf(req), query);
    res.json(
      shaped(textOutboxPageResponse, {
        items: items.map(toTextOutboxItemDto),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }),
    );
  });

  return router;
}
