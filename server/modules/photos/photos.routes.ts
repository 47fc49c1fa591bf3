import { pipeline } from "node:stream/promises";
import { Router, type RequestHandler } from "express";
import { photoListResponse, photoUploadResponse } from "../../../src/lib/contracts/photos.js";
import { shaped } from "../../lib/contract.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth } from "../../middleware/auth.js";
import type { CaseService } from "../cases/case.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { toPhotoDto } from "./photo.mapper.js";
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
    async (req, res) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      // Access and the object are settled before the first byte: a refusal or a missing file is an ordinary JSON error.
      const object = await photos.open(actorOf(req), id, variant);
      res.set("Cache-Control", "private, max-age=3600");
      res.type(object.contentType);
      res.set("Content-Length", String(object.size));
      try {
        await pipeline(object.body, res);
      } catch (err) {
        // Headers are gone already: the reply can only be cut short. A reader who left is not worth a log line.
        if ((err as { code?: string }).code !== "ERR_STREAM_PREMATURE_CLOSE")
          req.log?.error({ err, photoId: id, variant }, "a photo stopped part way while it was being sent");
        res.destroy();
      }
    };
  router.get("/:id", send("display"));
  router.get("/:id/thumbnail", send("thumbnail"));
  return router;
}
