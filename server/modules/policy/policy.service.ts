import type { DataSource } from "typeorm";
import { ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type DeadlinePolicy } from "../../../src/lib/domain/deadlines.js";
import type { Actor } from "../auth/actor.js";
import { markTriageStale } from "../triage/triage.service.js";
import { DeadlinePolicyRecord } from "./deadline-policy.entity.js";

export interface PolicyView extends DeadlinePolicy {
  source: "default" | "landlord";
}

export class PolicyService {
  constructor(private readonly dataSource: DataSource) {}

  /** The landlord's timeframes, or the England social-housing default (TRADE.md §5) when none are set. */
  async forOrganisation(organisationId: number): Promise<PolicyView> {
    const row = await this.dataSource.getRepository(DeadlinePolicyRecord).findOneBy({ organisationId });
    if (!row) return { ...ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, source: "default" };
    const { emergencyMakeSafeHours, investigateWorkingDays, summaryWorkingDays, safetyWorkWorkingDays, supplementaryWorkWeeks } = row;
    return { emergencyMakeSafeHours, investigateWorkingDays, summaryWorkingDays, safetyWorkWorkingDays, supplementaryWorkWeeks, source: "landlord" };
  }

  async update(actor: Actor, policy: DeadlinePolicy): Promise<PolicyView> {
    await this.dataSource.transaction(async (m) => {
      await m.getRepository(DeadlinePolicyRecord).save({ organisationId: actor.organisationId, ...policy, updatedById: actor.id });
      // Every open case's deadlines follow the policy.
      await markTriageStale(m, { organisationId: actor.organisationId });
    });
    return this.forOrganisation(actor.organisationId);
  }

  async reset(actor: Actor): Promise<PolicyView> {
    await this.dataSource.transaction(async (m) => {
      await m.getRepository(DeadlinePolicyRecord).delete({ organisationId: actor.organisationId });
      await markTriageStale(m, { organisationId: actor.organisationId });
    });
    return this.forOrganisation(actor.organisationId);
  }
}
