import { z } from "zod";
import { id, instant } from "./common.js";

/** One version of a case's HHSRS assessment (GET/POST /api/cases/:id/assessments). */
export const assessmentResponse = z.object({
  id,
  version: z.number().int().min(1),
  likelihood: z.number(),
  spread: z.tuple([z.number(), z.number(), z.number(), z.number()]),
  justification: z.string(),
  /** Cut (not rounded) to two decimals by the server. */
  score: z.number(),
  band: z.string(),
  category: z.union([z.literal(1), z.literal(2)]),
  assessorId: id,
  createdAt: instant,
});
export type AssessmentResponse = z.infer<typeof assessmentResponse>;
export const assessmentListResponse = z.object({ assessments: z.array(assessmentResponse) });
