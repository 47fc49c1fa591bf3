// A damp or mould report: the stored values and the schema that both the tenant's form and the
// server validate with. Labels for people live in the client.
import { z } from "zod";
import type { CaseStatus } from "../domain/case-workflow.js";
import { HEATING_COST_ANSWERS, type HeatingCostAnswer } from "../domain/home-advice.js";

export { CASE_STATUSES } from "../domain/case-workflow.js";
export type { CaseStatus };

/** "sensor": the landlord opened the case from its own sensors' alert (never chosen by a tenant or in the staff form). */
export const CHANNELS = ["tenant-online", "phone", "letter", "email", "visit", "sensor"] as const;
export const STAFF_CHANNELS = ["phone", "letter", "email", "visit"] as const;
export const LOCATIONS = [
  "window",
  "external-wall",
  "ceiling",
  "corner",
  "behind-furniture",
  "floor",
  "bath-or-shower",
  "other",
] as const;
export const OBSERVATIONS = ["condensation", "mould-spots", "musty-smell", "peeling-paint", "wet-patches", "leak"] as const;
export const DURATIONS = ["days", "weeks", "months", "over-a-year", "not-sure"] as const;
export const AREAS = ["hand", "a4", "door", "larger"] as const;
export const VULNERABILITIES = ["children-under-15", "over-65", "breathing-or-immune", "pregnancy", "disability"] as const;
/** Neutral questions about the home's equipment; every answer is a fact about the home, never a fault. */
export const EQUIPMENT_ANSWERS = ["yes", "no", "sometimes", "not-sure", "none-fitted"] as const;

export type Channel = (typeof CHANNELS)[number];
export type Location = (typeof LOCATIONS)[number];
export type Observation = (typeof OBSERVATIONS)[number];
export type Duration = (typeof DURATIONS)[number];
export type Area = (typeof AREAS)[number];
export type Vulnerability = (typeof VULNERABILITIES)[number];
export type EquipmentAnswer = (typeof EQUIPMENT_ANSWERS)[number];
export { HEATING_COST_ANSWERS, type HeatingCostAnswer };

const list = <T extends readonly [string, ...string[]]>(values: T, field: string, what: string) =>
  z
    .array(z.enum(values, { error: `${field} can only hold ${values.join(", ")}.` }), { error: `Choose at least one ${what}.` })
    .min(1, `Choose at least one ${what}.`)
    .max(values.length)
    .transform((v) => [...new Set(v)]);

export const equipmentSchema = z
  .object({
    heatingUsable: z.enum(EQUIPMENT_ANSWERS).optional(),
    extractorFanWorks: z.enum(EQUIPMENT_ANSWERS).optional(),
    trickleVentsOpen: z.enum(EQUIPMENT_ANSWERS).optional(),
    /** Optional and asked without blame: "hard-to-afford" brings the landlord's support route into the home's advice. */
    heatingCost: z.enum(HEATING_COST_ANSWERS).optional(),
  })
  .strict();

export const caseReportSchema = z.object({
  /** A tenant may leave it out: their current home is used. */
  propertyId: z.number({ error: "propertyId must be a home's id." }).int().positive().optional(),
  description: z
    .string({ error: "Tell us in a few words what you see." })
    .trim()
    .min(3, "Tell us in a few words what you see.")
    .max(4000, "Please keep the description under 4,000 characters."),
  locations: list(LOCATIONS, "locations", "place"),
  observations: list(OBSERVATIONS, "observations", "thing you have noticed"),
  roomIds: z.array(z.number().int().positive(), { error: "roomIds must be a list of room ids." }).max(30).optional(),
  since: z.enum(DURATIONS, { error: `since must be one of ${DURATIONS.join(", ")}.` }).optional(),
  area: z.enum(AREAS, { error: `area must be one of ${AREAS.join(", ")}.` }).optional(),
  /** Skipped (undefined) is different from "none of these" (an empty list). */
  vulnerability: z
    .array(z.enum(VULNERABILITIES, { error: `vulnerability can only hold ${VULNERABILITIES.join(", ")}.` }))
    .max(VULNERABILITIES.length)
    .optional(),
  equipment: equipmentSchema.optional(),
});
export type CaseReport = z.infer<typeof caseReportSchema>;

/** What staff add when they log a report received by phone, letter, e-mail or a visit. */
export const staffCaseSchema = caseReportSchema.extend({
  propertyId: z.number({ error: "propertyId is required when staff log a report." }).int().positive(),
  channel: z.enum(STAFF_CHANNELS, { error: `channel must be one of ${STAFF_CHANNELS.join(", ")}.` }),
  awareAt: z.iso.datetime({ offset: true, error: "awareAt must be an ISO 8601 date-time with a time zone." }),
  tenantUserId: z.number().int().positive().optional(),
});
export type StaffCaseReport = z.infer<typeof staffCaseSchema>;
