import { z } from "zod";
import { ADMIN_ACTION_SUBJECTS } from "../../../src/lib/contracts/integrations.js";
import { homeSchema, uprnSchema } from "../../../src/lib/schemas/homes.js";
import { idParam } from "../../lib/validation.js";

export const keyParamsSchema = z.object({ keyId: idParam("The key id") });

/** PUT /api/v1/homes/by-uprn/:uprn: a whole home; the UPRN is the path's. Rooms are added only when the home is new. */
export const homeUpsertSchema = homeSchema.omit({ uprn: true });
export type HomeUpsertInput = z.infer<typeof homeUpsertSchema>;

export const uprnParamsSchema = z.object({
  uprn: uprnSchema.refine((v) => v !== null, "Give the home's UPRN in the path."),
});

/** GET /api/integrations/admin-actions: all of them, or those about keys or about webhook endpoints. */
export const adminActionListQuerySchema = z.object({
  subject: z.enum(ADMIN_ACTION_SUBJECTS, { error: `subject must be one of ${ADMIN_ACTION_SUBJECTS.join(", ")}.` }).optional(),
});
