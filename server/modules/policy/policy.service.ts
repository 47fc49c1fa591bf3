import type { DataSource, EntityManager } from "typeorm";
import { ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type DeadlinePolicy } from "../../../src/lib/domain/deadlines.js";
import type { EmergencyPhoneSource } from "../../lib/emergency-phone.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import { DeadlinePolicyRecord } from "./deadline-policy.entity.js";

/** Days of readings after the works before the fix is judged: our default (common practice, no source). */
export const DEFAULT_MONITORING_DAYS = 21;

export interface PolicyView extends DeadlinePolicy {
  /** The monitoring period after works, in days. */
  monitoringDays: number;
  /** The landlord's emergency line (told to tenants), or null when not set. */
  emergencyPhone: string | null;
  source: "default" | "landlord";
}

export class PolicyService implements EmergencyPhoneSource {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
  ) {}

  /** The landlord's timeframes, or the England social-housing default (TRADE.md §5) when none are set. */
  async forOrganisation(organisationId: number): Promise<PolicyView> {
    const row = await this.dataSource.getRepository(DeadlinePolicyRecord).findOneBy({ organisationId });
    if (!row)
      return {
        ...ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY,
        monitoringDays: DEFAULT_MONITORING_DAYS,
        emergencyPhone: null,
        source: "default",
      };
    const {
      emergencyMakeSafeHours,
      investigateWorkingDays,
      summaryWorkingDays,
      safetyWorkWorkingDays,
      supplementaryWorkWeeks,
      monitoringDays,
      emergencyPhone,
    } = row;
    return {
      emergencyMakeSafeHours,
      investigateWorkingDays,
      summaryWorkingDays,
      safetyWorkWorkingDays,
      supplementaryWorkWeeks,
      monitoringDays,
      emergencyPhone,
      source: "landlord",
    };
  }

  /** The landlord's emergency line for tenants' e-mails and letters, or null when the admin has not set one. */
  async emergencyPhoneOf(organisationId: number, m?: EntityManager): Promise<string | null> {
    const row = await (m ?? this.dataSource.manager).getRepository(DeadlinePolicyRecord).findOneBy({ organisationId });
    return row?.emergencyPhone ?? null;
  }

  async update(
    actor: Actor,
    policy: DeadlinePolicy & { monitoringDays: number; emergencyPhone?: string | null },
  ): Promise<PolicyView> {
    await this.dataSource.transaction(async (m) => {
      await m
        .getRepository(DeadlinePolicyRecord)
        .save({ organisationId: actor.organisationId, ...policy, updatedById: actor.id });
      // Every open case's deadlines follow the policy.
      await this.cases.markStale(m, { organisationId: actor.organisationId });
    });
    return this.forOrganisation(actor.organisationId);
  }

  async reset(actor: Actor): Promise<PolicyView> {
    await this.dataSource.transaction(async (m) => {
      await m.getRepository(DeadlinePolicyRecord).delete({ organisationId: actor.organisationId });
      await this.cases.markStale(m, { organisationId: actor.organisationId });
    });
    return this.forOrganisation(actor.organisationId);
  }
}
