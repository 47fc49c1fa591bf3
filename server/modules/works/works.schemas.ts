import { z } from "zod";
import { SLOT_WINDOWS, WORK_ORDER_PRIORITIES, WORK_ORDER_STATUSES, WORK_ORDER_TYPES } from "./work-order.entity.js";
import { idParam } from "../../lib/validation.js";
import { exportFormatSchema } from "../../../src/lib/contracts/export-query.js";

const isoDate = (field: string) =>
  z
    .string({ error: `${field} must be a date, YYYY-MM-DD.` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${field} must be a date, YYYY-MM-DD.`)
    .refine(
      (s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s),
      `${field} is not a real date.`,
    );

export const workOrderCreateSchema = z
  .object({
    type: z.enum(WORK_ORDER_TYPES, { error: `type must be one of ${WORK_ORDER_TYPES.join(", ")}.` }),
    description: z.string({ error: "Describe the work." }).trim().min(5, "Describe the work in a few words.").max(4000),
    roomIds: z.array(z.number().int().positive()).max(30).optional(),
    priority: z.enum(WORK_ORDER_PRIORITIES, { error: `priority must be one of ${WORK_ORDER_PRIORITIES.join(", ")}.` }).optional(),
    targetDate: isoDate("targetDate").optional(),
  })
  .strict();
export type WorkOrderCreate = z.infer<typeof workOrderCreateSchema>;

export const slotSchema = z.object({
  date: isoDate("slot.date"),
  window: z.enum(SLOT_WINDOWS, { error: `slot.window must be one of ${SLOT_WINDOWS.join(", ")}.` }),
});

const completionSchema = z
  .object({
    note: z.string({ error: "Say what was done." }).trim().min(5, "Say what was done, in a sentence.").max(8000),
    materials: z.string().trim().max(4000).optional(),
    minutesOnSite: z
      .number({ error: "minutesOnSite must be a number of minutes." })
      .int()
      .min(1)
      .max(24 * 60 * 5)
      .optional(),
    followOn: z.string().trim().max(4000).optional(),
    /** The London date the work was actually done: today or earlier, never assumed. */
    doneOn: isoDate("complete.doneOn"),
    /** Required when doneOn is before the booked day: why the work was done early. */
    earlyReason: z.string().trim().min(5, "Say why the work was done before the booked day.").max(2000).optional(),
    /** The type of the follow-on order raised when followOn is given (default: other). */
    followOnType: z.enum(WORK_ORDER_TYPES, { error: `followOnType must be one of ${WORK_ORDER_TYPES.join(", ")}.` }).optional(),
  })
  .strict();

export const workOrderPatchSchema = z.union([
  z
    .object({
      assigneeId: z.number({ error: "assigneeId must be an operative's user id." }).int().positive().nullable().optional(),
      contractorId: z.number({ error: "contractorId must be a contractor id." }).int().positive().nullable().optional(),
      slot: slotSchema,
    })
    .strict()
    .refine((p) => (p.assigneeId ?? null) !== null || (p.contractorId ?? null) !== null, {
      message: "Choose an operative (assigneeId) or a contractor (contractorId).",
    }),
  z
    .object({
      complete: completionSchema,
    })
    .strict(),
  z.object({ cancel: z.object({ reason: z.string().trim().min(3, "Give a short reason.").max(2000) }).strict() }).strict(),
]);
export type WorkOrderPatch = z.infer<typeof workOrderPatchSchema>;
/** PATCH bodies with `complete`: parsed on their own so a missing field is named (complete.doneOn…). */
export const workOrderCompleteSchema = z.object({ complete: completionSchema }).strict();
export type WorkOrderCompletion = z.infer<typeof completionSchema>;

export const bookingResponseSchema = z
  .object({
    response: z.enum(["confirm", "another-slot"], { error: "response must be confirm or another-slot." }),
    reason: z.string().trim().min(3, "Tell us which days or times suit you better.").max(2000).optional(),
  })
  .strict()
  .refine((b) => b.response === "confirm" || b.reason !== undefined, {
    path: ["reason"],
    message: "Tell us which days or times suit you better.",
  });

export const WORK_ORDER_SORTS = ["target", "slot", "created", "priority", "type", "status"] as const;
export const workOrderListQuerySchema = z.object({
  status: z
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
      const strange = values.filter((v) => !(WORK_ORDER_STATUSES as readonly string[]).includes(v));
      if (strange.length) {
        ctx.addIssue({
          code: "custom",
          message: `status: ${strange.join(", ")} is not one of ${WORK_ORDER_STATUSES.join(", ")}.`,
        });
        return z.NEVER;
      }
      return values as (typeof WORK_ORDER_STATUSES)[number][];
    })
    .optional(),
  type: z.enum(WORK_ORDER_TYPES, { error: `type must be one of ${WORK_ORDER_TYPES.join(", ")}.` }).optional(),
  assignee: z
    .string()
    .trim()
    .regex(/^(me|unassigned|[1-9]\d*)$/, "assignee must be me, unassigned or a user id.")
    .optional(),
  from: isoDate("from").optional(),
  to: isoDate("to").optional(),
  caseId: idParam("caseId").optional(),
  sort: z.enum(WORK_ORDER_SORTS, { error: `sort must be one of ${WORK_ORDER_SORTS.join(", ")}.` }).default("target"),
  order: z.enum(["asc", "desc"]).default("asc"),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, "pageSize can be at most 200.").default(25),
});
export type WorkOrderListQuery = z.infer<typeof workOrderListQuerySchema>;

/** GET /api/work-orders/export: the list's filters and sort (every page) and the format. */
export const workOrderExportQuerySchema = workOrderListQuerySchema
  .omit({ page: true, pageSize: true })
  .extend({ format: exportFormatSchema });

export const contractorSchema = z
  .object({
    name: z.string({ error: "Give the contractor's name." }).trim().min(2, "Give the contractor's name.").max(190),
    email: z.email({ error: "Give an e-mail address the contractor reads." }).max(190),
    phone: z.string().trim().max(40).optional(),
    trade: z.string().trim().max(100).optional(),
  })
  .strict();

export const verificationOutcomeSchema = z.discriminatedUnion("effective", [
  z
    .object({
      effective: z.literal(true),
      note: z.string().trim().min(3, "Say what the readings showed.").max(4000),
      /** Recording "fix effective" without enough readings after the works: the reason, kept on the timeline. */
      override: z
        .object({
          reason: z
            .string({ error: "Say why the fix can be judged without the readings." })
            .trim()
            .min(10, "Say why the fix can be judged without the readings (at least 10 characters).")
            .max(2000),
        })
        .strict()
        .optional(),
    })
    .strict(),
  z
    .object({
      effective: z.literal(false),
      note: z.string().trim().min(3, "Say what the readings showed.").max(4000),
      workOrder: workOrderCreateSchema,
    })
    .strict(),
]);
