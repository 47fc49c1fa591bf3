import { Router } from "express";
import { heatingSupportPolicyResponse, policyResponse, sensorAlertPolicyResponse } from "../../../src/lib/contracts/policy.js";
import { heatingSupportSchema } from "../../../src/lib/schemas/policy.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import { complaintPolicySchema, deadlinePolicySchema, sensorAlertPolicySchema } from "./policy.schemas.js";
import type { ComplaintPolicyView, PolicyService } from "./policy.service.js";
import { complaintPolicyResponse } from "../../../src/lib/contracts/complaints.js";
import { COMPLAINT_LETTER_KINDS, COMPLAINT_LETTER_PLACEHOLDERS } from "../../../src/lib/domain/complaint-letters.js";

const toComplaintPolicyDto = ({ letters, ...view }: ComplaintPolicyView) =>
  shaped(complaintPolicyResponse, {
    ...view,
    letters: COMPLAINT_LETTER_KINDS.map((kind) => ({ kind, ...letters[kind] })),
    placeholders: Object.entries(COMPLAINT_LETTER_PLACEHOLDERS).map(([name, meaning]) => ({ name, meaning })),
  });

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
  // Complaints: the timeframes, the escalation route told in the final response, and the letters' wording.
  router.get("/complaints", requireRole("officer", "admin"), async (req, res) => {
    res.json(toComplaintPolicyDto(await policy.complaintPolicyFor(actorOf(req).organisationId)));
  });
  router.put("/complaints", requireRole("admin"), async (req, res) => {
    res.json(toComplaintPolicyDto(await policy.updateComplaintPolicy(actorOf(req), parse(complaintPolicySchema, req.body))));
  });
  router.delete("/complaints", requireRole("admin"), async (req, res) => {
    res.json(toComplaintPolicyDto(await policy.resetComplaintPolicy(actorOf(req))));
  });
  // Sensor alerts: the rules each room's live figures are judged by (our own defaults).
  router.get("/sensor-alerts", requireRole("officer", "admin"), async (req, res) => {
    res.json(shaped(sensorAlertPolicyResponse, await policy.sensorAlertPolicyFor(actorOf(req).organisationId)));
  });
  router.put("/sensor-alerts", requireRole("admin"), async (req, res) => {
    const input = parse(sensorAlertPolicySchema, req.body);
    res.json(shaped(sensorAlertPolicyResponse, await policy.updateSensorAlertPolicy(actorOf(req), input)));
  });
  router.delete("/sensor-alerts", requireRole("admin"), async (req, res) => {
    res.json(shaped(sensorAlertPolicyResponse, await policy.resetSensorAlertPolicy(actorOf(req))));
  });
  // Heating support: the landlord's own help for tenants who say heating is hard to afford.
  router.get("/heating-support", requireRole("officer", "admin"), async (req, res) => {
    res.json(shaped(heatingSupportPolicyResponse, await policy.heatingSupportFor(actorOf(req).organisationId)));
  });
  router.put("/heating-support", requireRole("admin"), async (req, res) => {
    const input = parse(heatingSupportSchema, req.body);
    res.json(shaped(heatingSupportPolicyResponse, await policy.updateHeatingSupport(actorOf(req), input)));
  });
  router.delete("/heating-support", requireRole("admin"), async (req, res) => {
    res.json(shaped(heatingSupportPolicyResponse, await policy.resetHeatingSupport(actorOf(req))));
  });
  return router;
}
