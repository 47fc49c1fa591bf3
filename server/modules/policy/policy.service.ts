import type { DataSource, EntityManager } from "typeorm";
import { ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type DeadlinePolicy } from "../../../src/lib/domain/deadlines.js";
import type { EmergencyPhoneSource } from "../../lib/emergency-phone.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import { DeadlinePolicyRecord } from "./deadline-policy.entity.js";
import { ComplaintLetterTemplateRecord, ComplaintPolicyRecord } from "./complaint-policy.entity.js";
import type { ComplaintPolicyInput, SensorAlertPolicyInput } from "./policy.schemas.js";
import { SensorAlertPolicyRecord } from "./sensor-alert-policy.entity.js";
import { HeatingSupportPolicyRecord } from "./heating-support-policy.entity.js";
import type { HeatingSupportInput } from "../../../src/lib/schemas/policy.js";
import { DEFAULT_SENSOR_ALERT_SETTINGS, type SensorAlertSettings } from "../../../src/lib/domain/sensor-alerts.js";
import { COMPLAINT_HANDLING_DEFAULT_POLICY, type ComplaintPolicy } from "../../../src/lib/domain/complaint-clocks.js";
import {
  COMPLAINT_LETTER_KINDS,
  DEFAULT_COMPLAINT_LETTERS,
  DEFAULT_ESCALATION_ROUTE,
  type ComplaintLetterKind,
  type ComplaintLetterTemplate,
} from "../../../src/lib/domain/complaint-letters.js";

/** Days of readings after the works before the fix is judged: our default (common practice, no source). */
export const DEFAULT_MONITORING_DAYS = 21;

export interface PolicyView extends DeadlinePolicy {
  /** The monitoring period after works, in days. */
  monitoringDays: number;
  /** The landlord's emergency line (told to tenants), or null when not set. */
  emergencyPhone: string | null;
  source: "default" | "landlord";
}

/** A landlord's complaint timeframes, escalation route and letters, each with our default where not set. */
export interface ComplaintPolicyView extends ComplaintPolicy {
  escalationRoute: string;
  letters: Record<ComplaintLetterKind, ComplaintLetterTemplate & { source: "default" | "landlord" }>;
  /** "landlord" when the timeframes or escalation route are the landlord's own. */
  source: "default" | "landlord";
}

/** The landlord's help for tenants who find heating hard to afford; all null when not set. */
export interface HeatingSupportView {
  supportText: string | null;
  supportPhone: string | null;
  supportLink: string | null;
  source: "default" | "landlord";
}

/** A landlord's sensor alert rules, or our own defaults. */
export interface SensorAlertPolicyView extends SensorAlertSettings {
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

  /**
   * The landlord's complaint timeframes (the TRADE.md §5 default [M, from memory] when none are set),
   * escalation route and letters (our default wording for each kind not set).
   */
  async complaintPolicyFor(organisationId: number, m?: EntityManager): Promise<ComplaintPolicyView> {
    const manager = m ?? this.dataSource.manager;
    const row = await manager.getRepository(ComplaintPolicyRecord).findOneBy({ organisationId });
    const own = await manager.getRepository(ComplaintLetterTemplateRecord).findBy({ organisationId });
    const letters = Object.fromEntries(
      COMPLAINT_LETTER_KINDS.map((kind) => {
        const mine = own.find((t) => t.kind === kind);
        return [
          kind,
          mine
            ? { subject: mine.subject, body: mine.body, source: "landlord" as const }
            : { ...DEFAULT_COMPLAINT_LETTERS[kind], source: "default" as const },
        ];
      }),
    ) as ComplaintPolicyView["letters"];
    if (!row)
      return { ...COMPLAINT_HANDLING_DEFAULT_POLICY, escalationRoute: DEFAULT_ESCALATION_ROUTE, letters, source: "default" };
    return {
      stage1AcknowledgeWorkingDays: row.stage1AcknowledgeWorkingDays,
      stage1RespondWorkingDays: row.stage1RespondWorkingDays,
      stage2AcknowledgeWorkingDays: row.stage2AcknowledgeWorkingDays,
      stage2RespondWorkingDays: row.stage2RespondWorkingDays,
      extensionMaxWorkingDays: row.extensionMaxWorkingDays,
      escalationRoute: row.escalationRoute ?? DEFAULT_ESCALATION_ROUTE,
      letters,
      source: "landlord",
    };
  }

  /** Sets the landlord's complaint timeframes and escalation route, and the letters sent (null: back to ours). */
  async updateComplaintPolicy(actor: Actor, input: ComplaintPolicyInput): Promise<ComplaintPolicyView> {
    const { letters, ...timeframes } = input;
    await this.dataSource.transaction(async (m) => {
      await m
        .getRepository(ComplaintPolicyRecord)
        .save({ organisationId: actor.organisationId, ...timeframes, updatedById: actor.id });
      for (const kind of COMPLAINT_LETTER_KINDS) {
        const letter = letters[kind];
        if (letter === undefined) continue;
        const repo = m.getRepository(ComplaintLetterTemplateRecord);
        if (letter === null) await repo.delete({ organisationId: actor.organisationId, kind });
        else await repo.save({ organisationId: actor.organisationId, kind, ...letter, updatedById: actor.id });
      }
    });
    return this.complaintPolicyFor(actor.organisationId);
  }

  /** Back to the default timeframes, escalation route and letters. */
  async resetComplaintPolicy(actor: Actor): Promise<ComplaintPolicyView> {
    await this.dataSource.transaction(async (m) => {
      await m.getRepository(ComplaintPolicyRecord).delete({ organisationId: actor.organisationId });
      await m.getRepository(ComplaintLetterTemplateRecord).delete({ organisationId: actor.organisationId });
    });
    return this.complaintPolicyFor(actor.organisationId);
  }

  /** The landlord's sensor alert rules, or our own defaults (DEFAULT_SENSOR_ALERT_SETTINGS) when none are set. */
  async sensorAlertPolicyFor(organisationId: number): Promise<SensorAlertPolicyView> {
    const row = await this.dataSource.getRepository(SensorAlertPolicyRecord).findOneBy({ organisationId });
    if (!row) return { ...DEFAULT_SENSOR_ALERT_SETTINGS, source: "default" };
    const { mouldIndexAtLeast, hoursAt80In7Days, condensingDaysIn7Days, cooldownDays } = row;
    return { mouldIndexAtLeast, hoursAt80In7Days, condensingDaysIn7Days, cooldownDays, source: "landlord" };
  }

  /** Sets the landlord's sensor alert rules; they apply to the next evaluation of each room (alerts already raised stay). */
  async updateSensorAlertPolicy(actor: Actor, input: SensorAlertPolicyInput): Promise<SensorAlertPolicyView> {
    await this.dataSource
      .getRepository(SensorAlertPolicyRecord)
      .save({ organisationId: actor.organisationId, ...input, updatedById: actor.id });
    return this.sensorAlertPolicyFor(actor.organisationId);
  }

  async resetSensorAlertPolicy(actor: Actor): Promise<SensorAlertPolicyView> {
    await this.dataSource.getRepository(SensorAlertPolicyRecord).delete({ organisationId: actor.organisationId });
    return this.sensorAlertPolicyFor(actor.organisationId);
  }

  /** The landlord's heating support route, or nothing set (the tenant then sees neutral general wording). */
  async heatingSupportFor(organisationId: number): Promise<HeatingSupportView> {
    const row = await this.dataSource.getRepository(HeatingSupportPolicyRecord).findOneBy({ organisationId });
    if (!row) return { supportText: null, supportPhone: null, supportLink: null, source: "default" };
    const { supportText, supportPhone, supportLink } = row;
    return { supportText, supportPhone, supportLink, source: "landlord" };
  }

  async updateHeatingSupport(actor: Actor, input: HeatingSupportInput): Promise<HeatingSupportView> {
    await this.dataSource
      .getRepository(HeatingSupportPolicyRecord)
      .save({ organisationId: actor.organisationId, ...input, updatedById: actor.id });
    return this.heatingSupportFor(actor.organisationId);
  }

  async resetHeatingSupport(actor: Actor): Promise<HeatingSupportView> {
    await this.dataSource.getRepository(HeatingSupportPolicyRecord).delete({ organisationId: actor.organisationId });
    return this.heatingSupportFor(actor.organisationId);
  }
}
