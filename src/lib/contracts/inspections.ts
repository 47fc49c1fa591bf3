import { z } from "zod";
import { id, instant } from "./common.js";

export const CAUSES = [
  "condensation",
  "penetrating-damp",
  "rising-damp",
  "plumbing-leak",
  "roof-gutter",
  "other-unknown",
] as const;
export const MOULD_EXTENTS = ["none", "under-1-m2", "1-to-5-m2", "over-5-m2"] as const;
export const DEADLINE_STAGES = ["make-safe", "investigate", "summary", "safety-work", "supplementary-work"] as const;
export const DEADLINE_STATES = ["pending", "met", "missed", "not-applicable"] as const;

export const inspectionRoomReading = z.object({
  roomId: id,
  airTemperatureC: z.number().optional(),
  relativeHumidityPct: z.number().optional(),
  surfaceTemperaturesC: z.array(z.number()).optional(),
  moisture: z.object({ value: z.number(), unit: z.enum(["pct", "wme"]) }).optional(),
  note: z.string().optional(),
});

/** One inspection (GET /api/cases/:id/inspections). */
export const inspectionResponse = z.object({
  id,
  caseId: id,
  inspectorUserId: id,
  inspectedAt: instant,
  cause: z.enum(CAUSES),
  mouldExtent: z.enum(MOULD_EXTENTS),
  findings: z.string(),
  roomReadings: z.array(inspectionRoomReading),
  createdAt: instant,
});
export type InspectionResponse = z.infer<typeof inspectionResponse>;
export const inspectionListResponse = z.object({ inspections: z.array(inspectionResponse) });

/** POST /api/cases/:id/inspections. */
export const inspectionRecordedResponse = z.object({
  id,
  inspectedAt: instant,
  cause: z.enum(CAUSES),
  mouldExtent: z.enum(MOULD_EXTENTS),
});
export type InspectionRecorded = z.infer<typeof inspectionRecordedResponse>;

/** POST /api/cases/:id/summary. */
export const summarySentResponse = z.object({ id, sentAt: instant });
export type SummarySent = z.infer<typeof summarySentResponse>;

/** GET /api/cases/:id/deadlines: the statutory clocks. */
export const caseDeadline = z.object({
  stage: z.enum(DEADLINE_STAGES),
  dueAt: instant.nullable(),
  doneAt: instant.nullable(),
  state: z.enum(DEADLINE_STATES),
  /** Staff's reason the stage was missed, who gave it and when (staff only, like the whole route). */
  missedReason: z.object({ reason: z.string(), by: z.string().nullable(), at: instant }).nullable(),
});
export type CaseDeadline = z.infer<typeof caseDeadline>;
export const deadlinesResponse = z.object({ deadlines: z.array(caseDeadline) });

/** PUT /api/cases/:id/deadlines/:stage/missed-reason: why the stage was missed. */
export const missedReasonSchema = z.object({
  reason: z.string().trim().min(3, "Say in a few words why the deadline was missed.").max(2000, "At most 2 000 characters."),
});
