import type { z } from "zod";
import type { photoResponse } from "../../../src/lib/contracts/photos.js";
import type { Photo } from "./photo.entity.js";

export const toPhotoDto = (p: Photo): z.input<typeof photoResponse> => ({
  id: p.id,
  url: `/api/photos/${p.id}`,
  thumbnailUrl: `/api/photos/${p.id}/thumbnail`,
  width: p.width,
  height: p.height,
  sha256: p.sha256,
  workOrderId: p.workOrderId,
  createdAt: p.createdAt.toISOString(),
});
