import { Router, type RequestHandler } from "express";
import { photoListResponse, photoUploadResponse } from "../../../src/lib/contracts/photos.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth } from "../../middleware/auth.js";
import type { CaseService } from "../cases/case.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toPhotoDto } from "./photo.mapper.js";
import { NotFoundError } from "../../lib/errors.js";
import { photoUpload as receivePhotos } from "./photo-upload.js";
import type { PhotoService } from "./photo.service.js";

/** Mounted at /api/cases: a case's photos, `GET` and `POST /:id/photos`. */
export function createCasePhotosRouter({ cases, photos }: { cases: CaseService; photos: PhotoService }): Router {
  const router = Router();
  router.use(requireAuth);
  const photoUpload = receivePhotos(photos.incomingDir);

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
      res.status(201).json(shaped(photoUploadResponse, { photos: added.photos.map(toPhotoDto), refused: added.refused }));
    },
  );

  return router;
}

/** `GET /api/photos/:id` and `/thumbnail`: only through here, never as public static files. */
export function createPhotosRouter({ photos }: { photos: PhotoService }): Router {
  const router = Router();
  router.use(requireAuth);
  const send =
    (variant: "display" | "thumbnail"): RequestHandler =>
    async (req, res, next) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      const file = await photos.fileFor(actorOf(req), id, variant);
      res.set("Cache-Control", "private, max-age=3600");
      res.type("image/jpeg").sendFile(file, (err?: Error & { code?: string }) => {
        if (!err || res.headersSent) return;
        // The error is answered in JSON: not as a JPEG, and not cached.
        res.removeHeader("Content-Type");
        res.removeHeader("Cache-Control");
        next(err.code === "ENOENT" ? new NotFoundError("This photo's file is missing.") : err);
      });
    };
  router.get("/:id", send("display"));
  router.get("/:id/thumbnail", send("thumbnail"));
  return router;
}
