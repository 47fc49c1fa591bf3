import { z } from "zod";
import { calendarDate } from "../../../src/lib/contracts/common.js";

const text = (field: string, max = 5000) =>
  z
    .string({ error: `Write ${field}.` })
    .trim()
    .min(1, `Write ${field}.`)
    .max(max, `Keep ${field} to ${max.toLocaleString("en-GB")} characters or fewer.`);

const version = z.number({ error: "version must be the complaint's version you saw." }).int().positive();
/** Staff only: kept on the complaint's timeline for staff, never shown to the tenant. */
const note = text("the note", 2000).nullable().default(null);

/** A complaint, in the tenant's words (or staff's, writing down what the tenant said). */
export const raiseComplaintSchema = z.object({ description: text("the complaint") }).strict();

export const acknowledgeComplaintSchema = z.object({ version, note }).strict();

export const extendComplaintSchema = z
  .object({
    version,
    workingDays: z
      .number({ error: "workingDays must be a whole number of working days." })
      .int()
      .min(1, "workingDays must be at least 1."),
    /** Told to the tenant. */
    reason: text("the reason, which the tenant is told"),
    note,
  })
  .strict();

export const respondComplaintSchema = z.object({ version, response: text("the response", 10_000), note }).strict();

/** Escalation to stage 2: the tenant's reason, in their words. */
export const escalateComplaintSchema = z.object({ version, reason: text("why you are still unhappy") }).strict();
export const staffEscalateComplaintSchema = escalateComplaintSchema.extend({ note }).strict();

export const closeComplaintSchema = z.object({ version, note }).strict();

const pence = (field: string) =>
  z
    .number({ error: `${field} must be a whole number of pence.` })
    .int(`${field} must be a whole number of pence.`)
    .min(0, `${field} must not be negative.`)
    .max(100_000_000, `${field} must be at most 100,000,000 pence (£1,000,000).`)
    .nullable()
    .default(null);
const optionalText = (field: string) => text(field, 5000).nullable().default(null);

export const complaintRemedySchema = z
  .object({
    version,
    apology: z.boolean({ error: "apology must be true or false." }),
    apologyText: optionalText("the apology"),
    putRight: optionalText("what will be put right"),
    compensationOfferedPence: pence("compensationOfferedPence"),
    compensationOfferedOn: calendarDate.nullable().default(null),
    compensationAcceptedOn: calendarDate.nullable().default(null),
    compensationPaidPence: pence("compensationPaidPence"),
    compensationPaidOn: calendarDate.nullable().default(null),
    note,
  })
  .strict()
  .superRefine((r, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: "custom", path: [path], message });
    if ((r.compensationOfferedPence === null) !== (r.compensationOfferedOn === null))
      issue("compensationOfferedOn", "Give both the amount offered and the day it was offered, or neither.");
    if (r.compensationAcceptedOn !== null && r.compensationOfferedPence === null)
      issue("compensationAcceptedOn", "Compensation can only be accepted once an amount is offered.");
    if ((r.compensationPaidPence === null) !== (r.compensationPaidOn === null))
      issue("compensationPaidOn", "Give both the amount paid and the day it was paid, or neither.");
    if (r.compensationOfferedOn && r.compensationAcceptedOn && r.compensationAcceptedOn < r.compensationOfferedOn)
      issue("compensationAcceptedOn", "It cannot be accepted before it was offered.");
    if (r.compensationOfferedOn && r.compensationPaidOn && r.compensationPaidOn < r.compensationOfferedOn)
      issue("compensationPaidOn", "It cannot be paid before it was offered.");
    if (!r.apology && r.apologyText !== null) issue("apologyText", "Say apology: true to give an apology's words.");
  });
export type ComplaintRemedyInput = z.infer<typeof complaintRemedySchema>;
