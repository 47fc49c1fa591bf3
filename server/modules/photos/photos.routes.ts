import { Router, type RequestHandler } from "express";
import { parse } from "../../lib/validation.js";
import { actorOf, requireAuth } from "../../middleware/auth.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { PhotoService } from "./photo.service.js";

/** `GET /api/photos/:id` and `/thumbnail`: only through here, never as public static files. */
export function createPhotosRouter({ photos }: { photos: PhotoService }): Router {
  const router = Router();
  router.use(requireAuth);
  const send =
    (variant: "display" | "thumbnail"): RequestHandler =>
    async (req, res) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      const file = await photos.fileFor(actorOf(req), id, variant);
      res.set("Cache-Control", "private, max-age=3600");
      res.type("image/jpeg").sendFile(file);
    };
  router.get("/:id", send("display"));
  router.get("/:id/thumbnail", send("thumbnail"));
  return router;
}
