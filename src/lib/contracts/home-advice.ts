import { z } from "zod";
import { ADVICE_CAUTIONS, ADVICE_IDS, ADVICE_SOURCES, UNINSULATED_WALLS } from "../domain/home-advice.js";

const adviceItem = z.object({
  id: z.enum([...ADVICE_IDS, "no-oven-for-warmth"]),
  /** What the item's words pick from (the client holds the words, per language). */
  facts: z.object({
    heating: z.enum(["none", "unreliable", "storage", "radiators", "other"]).optional(),
    fan: z.enum(["broken", "not-recorded"]).optional(),
    readings: z.enum(["none", "dry", "condensing", "other"]).optional(),
    walls: z.enum([...UNINSULATED_WALLS, "none"]).optional(),
    glass: z.enum(["single", "none"]).optional(),
    costs: z.enum(["hard", "ok"]).optional(),
  }),
  cost: z.enum(["free", "under-20", "20-to-100", "landlords-job"]),
  cautions: z.array(z.enum(ADVICE_CAUTIONS)),
  source: z.enum(ADVICE_SOURCES),
});
export type AdviceItemResponse = z.infer<typeof adviceItem>;

/** GET /api/cases/:id/advice: the few things most likely to help in this case's home, ranked. */
export const homeAdviceResponse = z.object({
  caseId: z.number().int(),
  items: z.array(adviceItem),
  /** Always present: never heat a room with an oven, hob or unflued heater. */
  safety: adviceItem,
  /**
   * Present only when the tenant said heating is hard to afford: the landlord's own help, or all
   * fields null when the landlord has not set it (the client then shows neutral general wording).
   */
  support: z.object({ text: z.string().nullable(), phone: z.string().nullable(), link: z.string().nullable() }).nullable(),
});
export type HomeAdviceResponse = z.infer<typeof homeAdviceResponse>;
