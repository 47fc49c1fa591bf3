import { Router, type Request } from "express";
import { complaintListResponse, complaintResponse } from "../../../src/lib/contracts/complaints.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { isStaff } from "../auth/actor.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toComplaintDto } from "./complaint.mapper.js";
import type { ComplaintService, ComplaintWithClocks } from "./complaint.service.js";
import {
  acknowledgeComplaintSchema,
  closeComplaintSchema,
  complaintRemedySchema,
  escalateComplaintSchema,
  extendComplaintSchema,
  raiseComplaintSchema,
  respondComplaintSchema,
  staffEscalateComplaintSchema,
} from "./complaints.schemas.js";

// Maintenance staff (operatives and their leads) have no part in complaints: 403.
const TENANT_OR_OFFICERS = requireRole("tenant", "officer", "admin");
const OFFICERS = requireRole("officer", "admin");

async function reply(complaints: ComplaintService, req: Request, items: ComplaintWithClocks[]) {
  const audience = isStaff(actorOf(req)) ? "staff" : "tenant";
  const people = await complaints.raisers(items.map((i) => i.complaint));
  return items.map((i) => {
    const p = people.get(i.complaint.raisedByUserId);
    return toComplaintDto(i, p ? { name: p.name, role: p.role } : null, audience);
  });
}

/** Mounted at /api/cases: a case's complaints, and raising one. */
export function createCaseComplaintsRouter({ complaints }: { complaints: ComplaintService }): Router {
  const router = Router();
  router.get("/:id/complaints", TENANT_OR_OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const items = await complaints.listForCase(actorOf(req), id);
    res.json(shaped(complaintListResponse, { complaints: await reply(complaints, req, items) }));
  });
  router.post("/:id/complaints", TENANT_OR_OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { description } = parse(raiseComplaintSchema, req.body);
    const raised = await complaints.raise(actorOf(req), id, description);
    res.status(201).json(shaped(complaintResponse, (await reply(complaints, req, [raised]))[0]!));
  });
  return router;
}

/** Mounted at /api/complaints: the moves of one complaint. Each names the version it saw (409 when stale). */
export function createComplaintsRouter({ complaints }: { complaints: ComplaintService }): Router {
  const router = Router();
  const answer = async (req: Request, done: ComplaintWithClocks) =>
    shaped(complaintResponse, (await reply(complaints, req, [done]))[0]!);

  router.post("/:id/acknowledge", OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(await answer(req, await complaints.acknowledge(actorOf(req), id, parse(acknowledgeComplaintSchema, req.body))));
  });
  router.post("/:id/extend", OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(await answer(req, await complaints.extend(actorOf(req), id, parse(extendComplaintSchema, req.body))));
  });
  router.post("/:id/respond", OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(await answer(req, await complaints.respond(actorOf(req), id, parse(respondComplaintSchema, req.body))));
  });
  router.post("/:id/escalate", TENANT_OR_OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const actor = actorOf(req);
    const input = isStaff(actor) ? parse(staffEscalateComplaintSchema, req.body) : parse(escalateComplaintSchema, req.body);
    res.json(await answer(req, await complaints.escalate(actor, id, input)));
  });
  router.post("/:id/close", OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(await answer(req, await complaints.close(actorOf(req), id, parse(closeComplaintSchema, req.body))));
  });
  router.put("/:id/remedy", OFFICERS, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(await answer(req, await complaints.setRemedy(actorOf(req), id, parse(complaintRemedySchema, req.body))));
  });
  return router;
}
