import { Router } from "express";
import { homeAdviceResponse } from "../../../src/lib/contracts/home-advice.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { HomeAdviceService } from "./home-advice.service.js";

/** `/api/cases/:id/advice`: the case's tenant and its landlord's staff read the same advice list. */
export function createHomeAdviceRouter({ advice }: { advice: HomeAdviceService }): Router {
  const router = Router();
  router.get("/:id/advice", requireAuth, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const a = await advice.forCase(actorOf(req), id);
    res.json(shaped(homeAdviceResponse, { caseId: a.caseId, items: a.items, safety: a.safety, support: a.support }));
  });
  return router;
}
