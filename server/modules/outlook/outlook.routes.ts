import { Router } from "express";
import { outlookResponse } from "../../../src/lib/contracts/outlook.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toOutlookDto } from "./outlook.mapper.js";
import type { OutlookService } from "./outlook.service.js";

/** The tenant's own home's outlook: `GET /api/me/outlook`. */
export function createMyOutlookRouter({ outlook }: { outlook: OutlookService }): Router {
  const router = Router();
  router.get("/outlook", requireRole("tenant"), async (req, res) => {
    res.json(shaped(outlookResponse, toOutlookDto(await outlook.forTenant(actorOf(req)))));
  });
  return router;
}

/** A home's outlook for its landlord's staff: `GET /api/properties/:id/outlook`. */
export function createHomeOutlookRouter({ outlook }: { outlook: OutlookService }): Router {
  const router = Router();
  router.get("/:id/outlook", requireStaff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(outlookResponse, toOutlookDto(await outlook.forStaff(actorOf(req), id))));
  });
  return router;
}
