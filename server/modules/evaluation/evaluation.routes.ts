import { Router } from "express";
import { evaluationResponse } from "../../../src/lib/contracts/evaluation.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { EvaluationService } from "./evaluation.service.js";

/** Mounted at /api/cases (after the cases router, which requires sign-in): `GET /:id/evaluation`. */
export function createEvaluationRouter({ evaluation }: { evaluation: EvaluationService }): Router {
  const router = Router();
  router.get("/:id/evaluation", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(evaluationResponse, await evaluation.forCase(actorOf(req), id)));
  });
  return router;
}
