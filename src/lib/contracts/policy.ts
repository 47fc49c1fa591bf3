import { z } from "zod";

/** GET/PUT/DELETE /api/policy: the landlord's deadline timeframes and the monitoring period. */
export const policyResponse = z.object({
  emergencyMakeSafeHours: z.number().int(),
  investigateWorkingDays: z.number().int(),
  summaryWorkingDays: z.number().int(),
  safetyWorkWorkingDays: z.number().int(),
  supplementaryWorkWeeks: z.number().int(),
  monitoringDays: z.number().int(),
  /** The landlord's emergency telephone line, told to tenants; null when not set (the server always sends it). */
  emergencyPhone: z.string().nullable().default(null),
  /** "landlord": the organisation's own timeframes; "default": the England social-housing default. */
  source: z.enum(["default", "landlord"]),
});
export type PolicyResponse = z.infer<typeof policyResponse>;

/** GET/PUT/DELETE /api/policy/sensor-alerts: the rules a room's live sensor figures are judged by. */
export const sensorAlertPolicyResponse = z.object({
  mouldIndexAtLeast: z.number(),
  hoursAt80In7Days: z.number().int(),
  condensingDaysIn7Days: z.number().int(),
  cooldownDays: z.number().int(),
  /** "default": our own defaults (no standard sets them); "landlord": the landlord's own. */
  source: z.enum(["default", "landlord"]),
});
export type SensorAlertPolicyResponse = z.infer<typeof sensorAlertPolicyResponse>;

/** GET/PUT/DELETE /api/policy/heating-support: the landlord's help for tenants who find heating hard to afford. */
export const heatingSupportPolicyResponse = z.object({
  /** null: not set; tenants then see neutral general wording. */
  supportText: z.string().nullable(),
  supportPhone: z.string().nullable(),
  supportLink: z.string().nullable(),
  source: z.enum(["default", "landlord"]),
});
export type HeatingSupportPolicyResponse = z.infer<typeof heatingSupportPolicyResponse>;
