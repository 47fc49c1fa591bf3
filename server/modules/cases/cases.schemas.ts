import { z } from "zod";

/**
 * "It's got worse": the tenant's own words are required (`note`). They are the reason the case is
 * reopened and what the assignee or the officers read in their e-mail; without them it is a 400
 * naming `note`.
 */
export const worseSchema = z.object({
  note: z.string({ error: "Tell us briefly what has changed." }).trim().min(3, "Tell us briefly what has changed.").max(2000),
});

import { CASE_STATUSES } from "../../../src/lib/domain/case-workflow.js";
import { HAZARD_CLASSES } from "../../../src/lib/domain/deadlines.js";

export const casePatchSchema = z
  .object({
    status: z.enum(CASE_STATUSES, { error: `status must be one of ${CASE_STATUSES.join(", ")}.` }).optional(),
    assigneeId: z.number({ error: "assigneeId must be a user id, or null to unassign." }).int().positive().nullable().optional(),
    hazardClass: z.enum(HAZARD_CLASSES, { error: `hazardClass must be one of ${HAZARD_CLASSES.join(", ")}.` }).optional(),
    reason: z.string().trim().min(3, "Give a short reason.").max(2000).optional(),
  })
  .strict()
  .refine((p) => p.status !== undefined || p.assigneeId !== undefined || p.hazardClass !== undefined, {
    message: "Send at least one of status, assigneeId or hazardClass.",
  })
  .refine((p) => p.hazardClass === undefined || p.reason !== undefined, {
    path: ["reason"],
    message: "Say why the hazard is classified this way.",
  })
  // The case follows its work by itself; a status changed by hand is an exception and says why.
  .refine((p) => p.status === undefined || p.reason !== undefined, {
    path: ["reason"],
    message: "Say why the status is being changed by hand.",
  });
export type CasePatch = z.infer<typeof casePatchSchema>;
