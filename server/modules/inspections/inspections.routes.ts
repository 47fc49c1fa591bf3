import { Router } from "express";
import {
  deadlinesResponse,
  inspectionListResponse,
  inspectionRecordedResponse,
  summarySentResponse,
} from "../../../src/lib/contracts/inspections.js";
import { shaped } from "../../lib/contract.js";
import { toInspectionDto } from "./inspection.mapper.js";
import { computeDeadlines } from "../../../src/lib/domain/deadlines.js";
import type { Clock } from "../../lib/clock.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { CaseService } from "../cases/case.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { InspectionService } from "./inspection.service.js";
import { inspectionSchema, summarySchema } from "./inspections.schemas.js";

/** Mounted at /api/cases: inspections, the written summary and the deadline clocks (messages: the conversation module). */
export function createInspectionsRouter({
  cases,
  inspections,
  policy,
  clock,
}: {
  cases: CaseService;
  inspections: InspectionService;
  policy: PolicyService;
  clock: Clock;
}): Router {
  const router = Router();
  const staff = requireRole("officer", "maintenance", "admin");
  const officers = requireRole("officer", "admin");

  router.post("/:id/inspections", officers, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const saved = await inspections.record(actorOf(req), id, parse(inspectionSchema, req.body));
    res.status(201).json(
      shaped(inspectionRecordedResponse, {
        id: saved.id,
        inspectedAt: saved.inspectedAt.toISOString(),
        cause: saved.cause,
        mouldExtent: saved.mouldExtent,
      }),
    );
  });

  router.get("/:id/inspections", staff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(inspectionListResponse, { inspections: (await inspections.list(actorOf(req), id)).map(toInspectionDto) }));
  });

  router.post("/:id/summary", officers, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { body } = parse(summarySchema, req.body);
    const saved = await inspections.sendSummary(actorOf(req), id, body);
    res.status(201).json(shaped(summarySentResponse, { id: saved.id, sentAt: saved.sentAt.toISOString() }));
  });

  router.get("/:id/deadlines", staff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const c = await cases.getForActor(actorOf(req), id);
    const milestones = await inspections.milestones(c.id);
    const { source: _source, ...timeframes } = await policy.forOrganisation(c.organisationId);
    const deadlines = computeDeadlines({
      hazardClass: c.hazardClass,
      awareAt: c.awareAt,
      ...milestones,
      now: clock.now(),
      policy: timeframes,
    });
    res.json(
      shaped(deadlinesResponse, {
        deadlines: deadlines.map((d) => ({
          stage: d.stage,
          dueAt: d.dueAt?.toISOString() ?? null,
          doneAt: d.doneAt?.toISOString() ?? null,
          state: d.state,
        })),
      }),
    );
  });

  return router;
}
