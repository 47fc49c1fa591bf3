import { z } from "zod";
import { CASE_STATUSES, OPEN_CASE_STATUSES, type CaseStatus } from "../../../src/lib/domain/case-workflow.js";
import { BANDS } from "../../../src/lib/domain/hhsrs.js";
import { exportFormatSchema, queueColumnsSchema } from "../../../src/lib/contracts/export-query.js";

export const QUEUE_SORTS = [
  "reference",
  "address",
  "estate",
  "rooms",
  "awareAt",
  "channel",
  "risk",
  "mouldIndex",
  "area",
  "vulnerable",
  "band",
  "priority",
  "due",
  "status",
  "assignee",
] as const;
export type QueueSort = (typeof QUEUE_SORTS)[number];

export const OPEN_STATUSES: readonly CaseStatus[] = OPEN_CASE_STATUSES;
const RISKS = ["condensing", "mould-risk", "borderline", "dry", "unknown"] as const;
const CATEGORIES = ["1", "2", "none"] as const;
const BAND_LETTERS = BANDS.map((b) => b.band);

/** "a,b,c" → ["a","b","c"], each checked against the allowed values; the message names the field and the values. */
const commaList = <T extends string>(field: string, allowed: readonly T[]) =>
  z
    .string()
    .trim()
    .transform((raw, ctx) => {
      const values = [
        ...new Set(
          raw
            .split(",")
            .map((v) => v.trim())
            .filter(Boolean),
        ),
      ];
      const strange = values.filter((v) => !allowed.includes(v as T));
      if (strange.length) {
        ctx.addIssue({ code: "custom", message: `${field}: ${strange.join(", ")} is not one of ${allowed.join(", ")}.` });
        return z.NEVER;
      }
      return values as T[];
    });

const trueFalse = (field: string) =>
  z.enum(["true", "false"], { error: `${field} must be true or false.` }).transform((v) => v === "true");

export const queueQuerySchema = z.object({
  status: z
    .string()
    .trim()
    .transform((raw, ctx) => {
      if (raw === "open") return [...OPEN_STATUSES];
      const values = [
        ...new Set(
          raw
            .split(",")
            .map((v) => v.trim())
            .filter(Boolean),
        ),
      ];
      const strange = values.filter((v) => !(CASE_STATUSES as readonly string[]).includes(v));
      if (strange.length) {
        ctx.addIssue({
          code: "custom",
          message: `status: ${strange.join(", ")} is not one of open, ${CASE_STATUSES.join(", ")}.`,
        });
        return z.NEVER;
      }
      return values as CaseStatus[];
    })
    .optional(),
  risk: commaList("risk", RISKS).optional(),
  category: commaList("category", CATEGORIES).optional(),
  band: commaList("band", BAND_LETTERS).optional(),
  estate: z.string().trim().max(100).optional(),
  vulnerable: trueFalse("vulnerable").optional(),
  overdue: trueFalse("overdue").optional(),
  dueWithin: z.coerce
    .number({ error: "dueWithin must be a number of days." })
    .int("dueWithin must be a whole number of days.")
    .min(1, "dueWithin must be at least 1 day.")
    .max(365, "dueWithin can be at most 365 days.")
    .optional(),
  assignee: z
    .string()
    .trim()
    .regex(/^(me|unassigned|[1-9]\d*)$/, "assignee must be me, unassigned or a user id.")
    .optional(),
  q: z.string().trim().max(100, "The search can be at most 100 characters.").optional(),
  sort: z.enum(QUEUE_SORTS, { error: `sort must be one of ${QUEUE_SORTS.join(", ")}.` }).default("priority"),
  order: z.enum(["asc", "desc"], { error: "order must be asc or desc." }).optional(),
  page: z.coerce.number({ error: "page must be a number." }).int().min(1, "page starts at 1.").max(100_000).default(1),
  pageSize: z.coerce
    .number({ error: "pageSize must be a number." })
    .int()
    .min(1, "pageSize must be at least 1.")
    .max(200, "pageSize can be at most 200.")
    .default(25),
});
export type QueueQuery = z.infer<typeof queueQuerySchema>;

/** GET /api/cases/export: the queue's filters and sort (every page), the format and the shown columns. */
export const queueExportQuerySchema = queueQuerySchema
  .omit({ page: true, pageSize: true })
  .extend({ format: exportFormatSchema, columns: queueColumnsSchema.optional() });

export const bulkUpdateSchema = z
  .object({
    ids: z
      .array(z.number().int().positive(), { error: "ids must be a list of case ids." })
      .min(1, "Choose at least one case.")
      .max(200, "Change at most 200 cases at once."),
    status: z.enum(CASE_STATUSES, { error: `status must be one of ${CASE_STATUSES.join(", ")}.` }).optional(),
    assigneeId: z.number({ error: "assigneeId must be a user id, or null to unassign." }).int().positive().nullable().optional(),
    reason: z.string().trim().min(3, "Give a short reason.").max(2000).optional(),
  })
  .strict()
  .refine((b) => b.status !== undefined || b.assigneeId !== undefined, { message: "Send status or assigneeId (or both)." })
  // A status changed by hand is an exception and says why (as PATCH /api/cases/:id).
  .refine((b) => b.status === undefined || b.reason !== undefined, {
    path: ["reason"],
    message: "Say why the status is being changed by hand.",
  });
export type BulkUpdate = z.infer<typeof bulkUpdateSchema>;

/** POST /api/cases/bulk/preview: the chosen cases, and optionally the status a change would move them to. */
export const bulkPreviewSchema = z
  .object({
    ids: z
      .array(z.number().int().positive(), { error: "ids must be a list of case ids." })
      .min(1, "Choose at least one case.")
      .max(200, "Change at most 200 cases at once."),
    status: z.enum(CASE_STATUSES, { error: `status must be one of ${CASE_STATUSES.join(", ")}.` }).optional(),
  })
  .strict();
