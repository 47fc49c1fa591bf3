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
