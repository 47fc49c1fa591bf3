import { Router } from "express";
import { policyResponse } from "../../../src/lib/contracts/policy.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { deadlinePolicySchema } from "./policy.schemas.js";
import type { PolicyService } from "./policy.service.js";

/** `/api/policy`: staff read their landlord's deadline policy; admins change or reset it. */
export function createPolicyRouter({ policy }: { policy: PolicyService }): Router {
  const router = Router();
  router.get("/", requireStaff, async (req, res) => {
    res.json(shaped(policyResponse, await policy.forOrganisation(actorOf(req).organisationId)));
  });
  router.put("/", requireRole("admin"), async (req, res) => {
    res.json(shaped(policyResponse, await policy.update(actorOf(req), parse(deadlinePolicySchema, req.body))));
  });
  router.delete("/", requireRole("admin"), async (req, res) => {
    res.json(shaped(policyResponse, await policy.reset(actorOf(req))));
  });
  return router;
}
