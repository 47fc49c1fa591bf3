import { z } from "zod";
import { wholeNumberOf } from "../../../src/lib/schemas/quantity.js";
import { emergencyPhoneSchema } from "../../../src/lib/schemas/policy.js";

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
