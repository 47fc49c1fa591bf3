import { Router } from "express";
import {
  deadlinesResponse,
  inspectionListResponse,
  missedReasonSchema,
  inspectionRecordedResponse,
  summarySentResponse,
} from "../../../src/lib/contracts/inspections.js";
import { shaped } from "../../lib/contract.js";
import { toInspectionDto } from "./inspection.mapper.js";
import { computeDeadlines, DEADLINE_STAGES } from "../../../src/lib/domain/deadlines.js";
import { z } from "zod";
import type { Clock } from "../../lib/clock.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { UserService } from "../users/user.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { InspectionService } from "./inspection.service.js";
import { inspectionSchema, summarySchema } from "./inspections.schemas.js";

const stageParamsSchema = idParamsSchema.extend({
  stage: z.enum(DEADLINE_STAGES, { error: `stage must be one of ${DEADLINE_STAGES.join(", ")}.` }),
});

/** Mounted at /api/cases: inspections, the written summary and the deadline clocks (messages: the conversation module). */
export function createInspectionsRouter({
  cases,
  inspections,
  policy,
  users,
  clock,
}: {
  cases: CaseService;
  inspections: InspectionService;
  policy: PolicyService;
  users: UserService;
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

  /** The case's statutory clocks now, from its facts and the landlord's policy. */
  const deadlinesOf = async (c: Case) => {
    const milestones = await inspections.milestones(c.id);
    const { source: _source, ...timeframes } = await policy.forOrganisation(c.organisationId);
    return computeDeadlines({
      hazardClass: c.hazardClass,
      awareAt: c.awareAt,
      ...milestones,
      now: clock.now(),
      policy: timeframes,
    });
  };

  router.get("/:id/deadlines", staff, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const c = await cases.getForActor(actorOf(req), id);
    const deadlines = await deadlinesOf(c);
    const reasons = await inspections.missedReasons([c.id]);
    const people = await users.people(reasons.map((r) => r.recordedById));
    res.json(
      shaped(deadlinesResponse, {
        deadlines: deadlines.map((d) => {
          const r = reasons.find((x) => x.stage === d.stage);
          return {
            stage: d.stage,
            dueAt: d.dueAt?.toISOString() ?? null,
            doneAt: d.doneAt?.toISOString() ?? null,
            state: d.state,
            missedReason: r
              ? { reason: r.reason, by: people.get(r.recordedById)?.name ?? null, at: r.recordedAt.toISOString() }
              : null,
          };
        }),
      }),
    );
  });

  router.put("/:id/deadlines/:stage/missed-reason", officers, async (req, res) => {
    const { id, stage } = parse(stageParamsSchema, req.params, "params");
    const { reason } = parse(missedReasonSchema, req.body);
    await inspections.explainMissedDeadline(actorOf(req), id, stage, reason, async (c) =>
      (await deadlinesOf(c)).some((d) => d.stage === stage && d.state === "missed"),
    );
    res.status(204).end();
  });

  return router;
}
