import { Router } from "express";
import { outboxPageResponse } from "../../../src/lib/contracts/mail.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toOutboxItemDto } from "./mail.mapper.js";
import { outboxListQuerySchema } from "./mail.schemas.js";
import type { MailService } from "./mail.service.js";

/** `/api/outbox`: each e-mail's state for staff (admins: all of the landlord's; officers: those about cases), and resending. */
export function createOutboxRouter({ mail }: { mail: MailService }): Router {
  const router = Router();
  router.use(requireRole("admin", "officer"));

  router.get("/", async (req, res) => {
    const query = parse(outboxListQuerySchema, req.query, "query");
    const { items, total } = await mail.list(actorOf(req), query);
    res.json(
      shaped(outboxPageResponse, { items: items.map(toOutboxItemDto), total, page: query.page, pageSize: query.pageSize }),
    );
  });

  router.post("/:id/resend", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.status(202).json(toOutboxItemDto(await mail.resend(actorOf(req), id)));
  });

  return router;
}
