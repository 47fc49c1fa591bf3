import { z } from "zod";
import { emergencyPhoneSchema } from "../../../src/lib/schemas/policy.js";

const whole = (field: string, min: number, max: number, unit: string) =>
  z
    .number({ error: `${field} must be a whole number of ${unit}.` })
    .int(`${field} must be a whole number of ${unit}.`)
    .min(min, `${field} must be at least ${min} ${unit}.`)
    .max(max, `${field} must be at most ${max} ${unit}.`);

// The bounds are our own sanity limits, not law: a landlord may set shorter timeframes than the default.
export const deadlinePolicySchema = z
  .object({
    emergencyMakeSafeHours: whole("emergencyMakeSafeHours", 1, 72, "hours"),
    investigateWorkingDays: whole("investigateWorkingDays", 1, 60, "working days"),
    summaryWorkingDays: whole("summaryWorkingDays", 1, 30, "working days"),
    safetyWorkWorkingDays: whole("safetyWorkWorkingDays", 1, 60, "working days"),
    supplementaryWorkWeeks: whole("supplementaryWorkWeeks", 1, 52, "weeks"),
    /** Optional so older clients keep working; 21 days when not sent. */
    monitoringDays: whole("monitoringDays", 7, 90, "days").default(21),
    /** The landlord's emergency line, told to tenants in the acknowledgement and the written summary; null for none. */
    emergencyPhone: emergencyPhoneSchema.default(null),
  })
  .strict();
