import { Router } from "express";
import type { z } from "zod";
import { assessmentListResponse, assessmentResponse } from "../../../src/lib/contracts/assessments.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { HhsrsAssessmentRecord } from "./assessment.entity.js";
import type { AssessmentService } from "./assessment.service.js";
import { assessmentSchema } from "./assessments.schemas.js";

const toDto = (a: HhsrsAssessmentRecord): z.input<typeof assessmentResponse> => ({
  id: a.id,
  version: a.version,
  likelihood: a.likelihood,
  spread: a.spread,
  justification: a.justification,
  score: Math.trunc(a.score * 100) / 100,
  band: a.band,
  category: a.category,
  assessorId: a.assessorUserId,
  createdAt: a.createdAt.toISOString(),
});

/** Mounted at /api/cases: `/:id/assessments` (officers and admins). */
export function createAssessmentsRouter({ assessments }: { assessments: AssessmentService }): Router {
  const router = Router();
  router.post("/:id/assessments", requireRole("officer", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const input = parse(assessmentSchema, req.body);
    const { record, displayScore } = await assessments.assess(actorOf(req), id, input);
    res.status(201).json(shaped(assessmentResponse, { ...toDto(record), score: displayScore }));
  });
  router.get("/:id/assessments", requireRole("officer", "maintenance", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(assessmentListResponse, { assessments: (await assessments.list(actorOf(req), id)).map(toDto) }));
  });
  return router;
}
