// The landlord's deadline timeframes as GET/PUT/DELETE /api/policy answer them (src/lib/contracts/policy.ts).
// Types only from the domain: importing deadlines.ts itself would pull the bank-holiday data into the browser.
import type { PolicyResponse } from "@/lib/contracts";
import type { DeadlinePolicy } from "@/lib/domain/deadlines";

/** The timeframes plus the monitoring period after works (not a statutory deadline). */
export type LandlordPolicy = Omit<PolicyResponse, "source" | "emergencyPhone">;
/** What PUT /api/policy takes: the timeframes and the landlord's emergency line (null for none). */
export type PolicyUpdate = LandlordPolicy & { emergencyPhone: string | null };
export type { DeadlinePolicy };
export type PolicyField = keyof LandlordPolicy;

export type PolicyView = PolicyResponse;

/**
 * The England social-housing default (src/lib/domain/deadlines.ts ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY,
 * copied so the page can show it without loading the holiday data; a client test checks they match).
 */
export const ENGLAND_DEFAULT: Readonly<LandlordPolicy> = {
  emergencyMakeSafeHours: 24,
  investigateWorkingDays: 10,
  summaryWorkingDays: 3,
  safetyWorkWorkingDays: 5,
  supplementaryWorkWeeks: 12,
  // Not a legal timeframe: our default (server/modules/policy/policy.service.ts DEFAULT_MONITORING_DAYS).
  monitoringDays: 21,
};

export interface PolicyFieldInfo {
  name: PolicyField;
  label: string;
  unit: { one: string; many: string };
  explanation: string;
  /** The server's limits (server/modules/policy/policy.schemas.ts; a client test checks they match). */
  min: number;
  max: number;
}

export const POLICY_FIELDS: readonly PolicyFieldInfo[] = [
  {
    name: "emergencyMakeSafeHours",
    label: "Make the home safe within (hours)",
    unit: { one: "hour", many: "hours" },
    explanation:
      "For an emergency hazard: the hours from when you became aware to when the hazard must be investigated and the home made safe. Counted in hours on the clock, nights and weekends included.",
    min: 1,
    max: 72,
  },
  {
    name: "investigateWorkingDays",
    label: "Investigate within (working days)",
    unit: { one: "working day", many: "working days" },
    explanation:
      "For a significant hazard, or one not classified yet: the working days from when you became aware to when the investigation must be done. The day you became aware does not count.",
    min: 1,
    max: 60,
  },
  {
    name: "summaryWorkingDays",
    label: "Written summary within (working days)",
    unit: { one: "working day", many: "working days" },
    explanation:
      "The working days from the end of the investigation to when the tenant must have a written summary of what was found and what will be done.",
    min: 1,
    max: 30,
  },
  {
    name: "safetyWorkWorkingDays",
    label: "Safety work begun within (working days)",
    unit: { one: "working day", many: "working days" },
    explanation:
      "For a significant hazard: the working days from the end of the investigation to when work to make the home safe must have started.",
    min: 1,
    max: 60,
  },
  {
    name: "supplementaryWorkWeeks",
    label: "Further work begun within (weeks)",
    unit: { one: "week", many: "weeks" },
    explanation:
      "The weeks from the end of the investigation to when any further work that stops the damp or mould coming back must have started. Counted in calendar weeks, weekends included.",
    min: 1,
    max: 52,
  },
  {
    name: "monitoringDays",
    label: "Check the fix for (days)",
    unit: { one: "day", many: "days" },
    explanation:
      "Not a legal timeframe: how long readings are collected after the works before the maintenance lead decides whether the damp has really stopped. Tenant and lead are reminded when it ends.",
    min: 7,
    max: 90,
  },
];

/** "1 hour", "24 hours" (the same helper as the server's validation messages). */
export { quantity as amount } from "@/lib/schemas/quantity";
