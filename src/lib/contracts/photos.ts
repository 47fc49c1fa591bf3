import { z } from "zod";
import { id, instant } from "./common.js";

/** A photo of a case (GET/POST /api/cases/:id/photos, POST /api/work-orders/:id/photos). */
export const photoResponse = z.object({
  id,
  url: z.string(),
  thumbnailUrl: z.string(),
  width: z.number().int(),
  height: z.number().int(),
  sha256: z.string(),
  /** Set for the photos taken after a work order's works. */
  workOrderId: id.nullable(),
  createdAt: instant,
});
export type PhotoResponse = z.infer<typeof photoResponse>;
export const photoListResponse = z.object({ photos: z.array(photoResponse) });

/** A file of an upload that was not stored: the name it was sent with and why, in plain words. */
export const refusedPhoto = z.object({ name: z.string(), reason: z.string() });
export type RefusedPhoto = z.infer<typeof refusedPhoto>;

/**
 * POST /api/cases/:id/photos and /api/work-orders/:id/photos: each file is taken or refused on its
 * own. 201 when at least one was taken (`photos`), with the others in `refused`; when none could be
 * taken, a 4xx whose `error.details.refused` lists every file's reason.
 */
export const photoUploadResponse = z.object({ photos: z.array(photoResponse), refused: z.array(refusedPhoto) });
export type PhotoUploadResponse = z.infer<typeof photoUploadResponse>;
