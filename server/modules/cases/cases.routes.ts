import { Router } from "express";
import { caseEventsResponse, myCasesResponse, worseResponse } from "../../../src/lib/contracts/cases.js";
import { shaped } from "../../lib/contract.js";
import { caseReportSchema, staffCaseSchema } from "../../../src/lib/schemas/case-report.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth, requireRole } from "../../middleware/auth.js";
import { isStaff, type Actor } from "../auth/actor.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { CaseService } from "./case.service.js";
import { toCaseDto, toCaseEventDto, type Audience } from "./case.mapper.js";
import { casePatchSchema, worseSchema } from "./cases.schemas.js";

const audienceOf = (actor: Actor): Audience => (isStaff(actor) ? "staff" : "tenant");

/** Each case's photo count and first photo (PhotoService gives it; cases depend on no photo code). */
export interface CasePhotoSummaries {
  summaries(caseIds: number[]): Promise<Map<number, { count: number; firstId: number }>>;
}

/** Works a case's triage figures out again at once (the triage module provides it; cases depend on no triage code). */
export interface CaseFiguresRefresher {
  refresh(caseId: number): Promise<unknown>;
}

/** The case itself; its photos' routes are in photos.routes.ts (createCasePhotosRouter). */
export function createCasesRouter({ cases, figures }: { cases: CaseService; figures: CaseFiguresRefresher }): Router {
  const router = Router();
  router.use(requireAuth);

  router.post("/", requireRole("tenant", "officer", "admin"), async (req, res) => {
    const actor = actorOf(req);
    const input = isStaff(actor) ? parse(staffCaseSchema, req.body) : parse(caseReportSchema, req.body);
    const created = await cases.create(actor, input);
    res.status(201).json(toCaseDto(created, audienceOf(actor)));
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(toCaseDto(await cases.getForActor(actorOf(req), id), audienceOf(actorOf(req))));
  });

  router.patch("/:id", requireRole("officer", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const patch = parse(casePatchSchema, req.body);
    res.json(toCaseDto(await cases.update(actorOf(req), id, patch)));
  });

  router.get("/:id/events", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const audience = audienceOf(actorOf(req));
    res.json(
      shaped(caseEventsResponse, { events: (await cases.events(actorOf(req), id)).map((e) => toCaseEventDto(e, audience)) }),
    );
  });

  router.post("/:id/worse", requireRole("tenant"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { note } = parse(worseSchema, req.body);
    const outcome = await cases.reportWorse(actorOf(req), id, note);
    // Re-scored now, not at the next sweep: the queue shows the raised priority straight away.
    await figures.refresh(id);
    res.json(shaped(worseResponse, outcome));
  });

  return router;
}

/** `GET /api/me/cases`: the tenant's own cases, each with its photo count and first thumbnail. */
export function createMyCasesRouter({ cases, photos }: { cases: CaseService; photos: CasePhotoSummaries }): Router {
  const router = Router();
  router.get("/", requireRole("tenant"), async (req, res) => {
    const items = await cases.listForTenant(actorOf(req));
    const summaries = await photos.summaries(items.map((c) => c.id));
    res.json(
      shaped(myCasesResponse, {
        items: items.map((c) => {
          const s = summaries.get(c.id);
          return {
            ...toCaseDto(c, "tenant"),
            photoCount: s?.count ?? 0,
            thumbnailUrl: s ? `/api/photos/${s.firstId}/thumbnail` : null,
          };
        }),
      }),
    );
  });
  return router;
}
