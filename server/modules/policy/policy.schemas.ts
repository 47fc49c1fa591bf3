import { z } from "zod";
import { wholeNumberOf } from "../../../src/lib/schemas/quantity.js";
import { emergencyPhoneSchema } from "../../../src/lib/schemas/policy.js";
import { SENSOR_ALERT_BOUNDS } from "../../../src/lib/domain/sensor-alerts.js";
import {
  COMPLAINT_LETTER_KINDS,
  missingPlaceholders,
  unknownPlaceholders,
  type ComplaintLetterKind,
} from "../../../src/lib/domain/complaint-letters.js";

const hours = { one: "hour", many: "hours" };
const workingDays = { one: "working day", many: "working days" };
const weeks = { one: "week", many: "weeks" };
const days = { one: "day", many: "days" };

// The bounds are our own sanity limits, not law: a landlord may set shorter timeframes than the default.
export const deadlinePolicySchema = z
  .object({
    emergencyMakeSafeHours: wholeNumberOf("emergencyMakeSafeHours", 1, 72, hours),
    investigateWorkingDays: wholeNumberOf("investigateWorkingDays", 1, 60, workingDays),
    summaryWorkingDays: wholeNumberOf("summaryWorkingDays", 1, 30, workingDays),
    safetyWorkWorkingDays: wholeNumberOf("safetyWorkWorkingDays", 1, 60, workingDays),
    supplementaryWorkWeeks: wholeNumberOf("supplementaryWorkWeeks", 1, 52, weeks),
    /** Optional so older clients keep working; 21 days when not sent. */
    monitoringDays: wholeNumberOf("monitoringDays", 7, 90, days).default(21),
    /** The landlord's emergency line, told to tenants in the acknowledgement and the written summary; null for none. */
    emergencyPhone: emergencyPhoneSchema.default(null),
  })
  .strict();

const text = (field: string, max: number) =>
  z
    .string({ error: `${field} must be text.` })
    .trim()
    .min(1, `${field} must not be empty.`)
    .max(max, `${field} must be at most ${max.toLocaleString("en-GB")} characters.`);

const letterSchema = (kind: ComplaintLetterKind) =>
  z
    .object({ subject: text(`letters.${kind}.subject`, 200), body: text(`letters.${kind}.body`, 10_000) })
    .strict()
    .superRefine((letter, ctx) => {
      const unknown = [...new Set([...unknownPlaceholders(letter.subject), ...unknownPlaceholders(letter.body)])];
      if (unknown.length)
        ctx.addIssue({
          code: "custom",
          path: ["body"],
          message: `Unknown placeholder${unknown.length > 1 ? "s" : ""}: ${unknown.map((p) => `{{${p}}}`).join(", ")}.`,
        });
      const missing = missingPlaceholders(kind, letter.body);
      if (missing.length)
        ctx.addIssue({
          code: "custom",
          path: ["body"],
          message: `This letter must keep ${missing.map((p) => `{{${p}}}`).join(" and ")}.`,
        });
    })
    .nullable();

// Our own sanity bounds, as for the deadline policy; the default is TRADE.md §5 [M, from memory].
export const complaintPolicySchema = z
  .object({
    stage1AcknowledgeWorkingDays: wholeNumberOf("stage1AcknowledgeWorkingDays", 1, 30, workingDays),
    stage1RespondWorkingDays: wholeNumberOf("stage1RespondWorkingDays", 1, 60, workingDays),
    stage2AcknowledgeWorkingDays: wholeNumberOf("stage2AcknowledgeWorkingDays", 1, 30, workingDays),
    stage2RespondWorkingDays: wholeNumberOf("stage2RespondWorkingDays", 1, 60, workingDays),
    extensionMaxWorkingDays: wholeNumberOf("extensionMaxWorkingDays", 1, 30, workingDays),
    /** null: our default wording. */
    escalationRoute: text("escalationRoute", 2000).nullable().default(null),
    /** Each letter's own wording; null puts our default back; a kind left out keeps what is stored. */
    letters: z
      .object(
        Object.fromEntries(COMPLAINT_LETTER_KINDS.map((k) => [k, letterSchema(k).optional()])) as {
          [K in ComplaintLetterKind]: z.ZodOptional<ReturnType<typeof letterSchema>>;
        },
      )
      .strict()
      .default({}),
  })
  .strict();
export type ComplaintPolicyInput = z.infer<typeof complaintPolicySchema>;

const b = SENSOR_ALERT_BOUNDS;
// Our own sanity bounds (SENSOR_ALERT_BOUNDS); the defaults are our own too (DEFAULT_SENSOR_ALERT_SETTINGS).
export const sensorAlertPolicySchema = z
  .object({
    mouldIndexAtLeast: z
      .number({ error: "mouldIndexAtLeast must be a number." })
      .min(b.mouldIndexAtLeast.min, `mouldIndexAtLeast must be at least ${b.mouldIndexAtLeast.min}.`)
      .max(b.mouldIndexAtLeast.max, `mouldIndexAtLeast must be at most ${b.mouldIndexAtLeast.max}.`)
      .refine((v) => Number.isInteger(v * 10), "mouldIndexAtLeast takes one decimal place."),
    hoursAt80In7Days: wholeNumberOf("hoursAt80In7Days", b.hoursAt80In7Days.min, b.hoursAt80In7Days.max, hours),
    condensingDaysIn7Days: wholeNumberOf("condensingDaysIn7Days", b.condensingDaysIn7Days.min, b.condensingDaysIn7Days.max, days),
    cooldownDays: wholeNumberOf("cooldownDays", b.cooldownDays.min, b.cooldownDays.max, days),
  })
  .strict();
export type SensorAlertPolicyInput = z.infer<typeof sensorAlertPolicySchema>;
