import { Router } from "express";
import { caseEventsResponse, myCasesResponse } from "../../../src/lib/contracts/cases.js";
import { photoListResponse } from "../../../src/lib/contracts/photos.js";
import { shaped } from "../../lib/contract.js";
import multer from "multer";
import { caseReportSchema, staffCaseSchema } from "../../../src/lib/schemas/case-report.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth, requireRole } from "../../middleware/auth.js";
import { isStaff } from "../auth/actor.js";
import { toPhotoDto } from "../photos/photo.mapper.js";
import { MAX_PHOTO_BYTES, MAX_PHOTOS_PER_UPLOAD, type PhotoService } from "../photos/photo.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { CaseService } from "./case.service.js";
import { toCaseDto, toCaseEventDto } from "./case.mapper.js";
import { casePatchSchema, worseSchema } from "./cases.schemas.js";
import { uploadTmpDir } from "./upload-dir.js";


export function createCasesRouter({ cases, photos }: { cases: CaseService; photos: PhotoService }): Router {
  const router = Router();
  router.use(requireAuth);
  const photoUpload = multer({ dest: uploadTmpDir, limits: { fileSize: MAX_PHOTO_BYTES, files: MAX_PHOTOS_PER_UPLOAD, fields: 20 } }).array("photos", MAX_PHOTOS_PER_UPLOAD);

  router.post("/", requireRole("tenant", "officer", "admin"), async (req, res) => {
    const actor = actorOf(req);
    const input = isStaff(actor) ? parse(staffCaseSchema, req.body) : parse(caseReportSchema, req.body);
    const created = await cases.create(actor, input);
    res.status(201).json(toCaseDto(await cases.getForActor(actor, created.id)));
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(toCaseDto(await cases.getForActor(actorOf(req), id)));
  });

  router.patch("/:id", requireRole("officer", "admin"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const patch = parse(casePatchSchema, req.body);
    res.json(toCaseDto(await cases.update(actorOf(req), id, patch)));
  });

  router.get("/:id/events", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(caseEventsResponse, { events: (await cases.events(actorOf(req), id)).map(toCaseEventDto) }));
  });

  router.post("/:id/worse", requireRole("tenant"), async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { note } = parse(worseSchema, req.body);
    await cases.reportWorse(actorOf(req), id, note);
    res.status(204).end();
  });

  router.get("/:id/photos", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(photoListResponse, { photos: (await photos.listForCase(actorOf(req), id)).map(toPhotoDto) }));
  });

  router.post(
    "/:id/photos",
    // Access first, so nothing is even written to a temporary file for a case the user cannot see.
    async (req, _res, next) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      await cases.getForActor(actorOf(req), id);
      next();
    },
    photoUpload,
    async (req, res) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      const added = await photos.addToCase(actorOf(req), id, files);
      res.status(201).json(shaped(photoListResponse, { photos: added.map(toPhotoDto) }));
    },
  );

  return router;
}

/** `GET /api/me/cases`: the tenant's own cases, each with its photo count and first thumbnail. */
export function createMyCasesRouter({ cases, photos }: { cases: CaseService; photos: PhotoService }): Router {
  const router = Router();
  router.get("/", requireRole("tenant"), async (req, res) => {
    const items = await cases.listForTenant(actorOf(req));
    const summaries = await photos.summaries(items.map((c) => c.id));
    res.json(
      shaped(myCasesResponse, {
        items: items.map((c) => {
          const s = summaries.get(c.id);
          return { ...toCaseDto(c), photoCount: s?.count ?? 0, thumbnailUrl: s ? `/api/photos/${s.firstId}/thumbnail` : null };
        }),
      }),
    );
  });
  return router;
}
