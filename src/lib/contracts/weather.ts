import { z } from "zod";
import { instant } from "./common.js";

/** An estate of the landlord and where it is, for the weather of its homes that have no coordinates. */
export const estateLocationResponse = z.object({
  estate: z.string(),
  latitude: z.number().nullable(),
  longitude: z.number().nullable(),
  updatedAt: instant.nullable(),
});

/** GET /api/estate-locations: every estate the landlord's homes are on. */
export const estateLocationListResponse = z.object({ items: z.array(estateLocationResponse) });
