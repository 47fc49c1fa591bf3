import { In, type DataSource } from "typeorm";
import type { DeadlineStage } from "../../../src/lib/domain/deadlines.js";
import type { Config } from "../../config/env.js";
import { ConflictError, ValidationError } from "../../lib/errors.js";
import type { Actor } from "../auth/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { MailService } from "../mail/mail.service.js";
import type { UserService } from "../users/user.service.js";
import { Inspection } from "./inspection.entity.js";
import { MissedDeadlineReason } from "./missed-deadline-reason.entity.js";
import type { InspectionInput } from "./inspections.schemas.js";
import { WrittenSummary } from "./written-summary.entity.js";
import type { Clock } from "../../lib/clock.js";
import type { EmergencyPhoneSource } from "../../lib/emergency-phone.js";

/** The investigation of a case: inspections and the written summary to the tenant. */
export class InspectionService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly mail: MailService,
    private readonly users: UserService,
    private readonly clock: Clock,
    /** The landlord's emergency line for the written summary's e-mail (PolicyService). */
    private readonly emergencyPhones?: EmergencyPhoneSource,
  ) {}

  /** Records an inspection; the case follows it forward to `investigated` (a new case via triaged), each step on its timeline. */
  async record(actor: Actor, caseId: number, input: InspectionInput): Promise<Inspection> {
    return this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const rooms = new Set(this.cases.roomsOf(c).map((r) => r.id));
      const strange = input.roomReadings.filter((r) => !rooms.has(r.roomId)).map((r) => r.roomId);
      if (strange.length)
        throw new ValidationError("roomReadings: choose rooms of this home.", [
          { field: "roomReadings", message: `Room ${strange.join(", ")} is not part of this home.` },
        ]);
      const inspectedAt = new Date(input.inspectedAt);
      if (inspectedAt.getTime() > this.clock.now().getTime() + 60_000)
        throw new ValidationError("inspectedAt: an inspection cannot be recorded in the future.", [
          { field: "inspectedAt", message: "Cannot be in the future." },
        ]);
      const repo = m.getRepository(Inspection);
      const saved = await repo.save(repo.create({ ...input, caseId: c.id, inspectedAt, inspectorUserId: actor.id }));
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "inspection-recorded",
        after: {
          inspectionId: saved.id,
          inspectedAt: inspectedAt.toISOString(),
          cause: input.cause,
          mouldExtent: input.mouldExtent,
        },
      });
      await this.cases.follow(m, c.id, "investigated", "Inspection recorded.", actor, { orBack: true });
      return saved;
    });
  }

  async list(actor: Actor, caseId: number): Promise<Inspection[]> {
    const c = await this.cases.getForActor(actor, caseId);
    return this.dataSource.getRepository(Inspection).find({ where: { caseId: c.id }, order: { inspectedAt: "ASC", id: "ASC" } });
  }

  /**
   * Staff's reason for a stage the case missed (`missed` is the state the caller worked out from the
   * case's deadlines now: a stage not missed is a 409). The latest reason replaces the one before; both
   * are on the staff timeline.
   */
  async explainMissedDeadline(
    actor: Actor,
    caseId: number,
    stage: DeadlineStage,
    reason: string,
    missed: (c: Case) => Promise<boolean>,
  ): Promise<MissedDeadlineReason> {
    return this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      if (!(await missed(c))) throw new ConflictError("That deadline has not been missed: there is nothing to explain.");
      const repo = m.getRepository(MissedDeadlineReason);
      const before = await repo.findOneBy({ caseId: c.id, stage });
      const saved = await repo.save({ caseId: c.id, stage, reason, recordedById: actor.id, recordedAt: this.clock.now() });
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "missed-deadline-explained",
        before: { reason: before?.reason ?? null },
        after: { stage, reason },
      });
      return saved;
    });
  }

  /** The reasons staff gave for a case's missed stages, with who gave them. */
  async missedReasons(caseIds: readonly number[]): Promise<MissedDeadlineReason[]> {
    if (caseIds.length === 0) return [];
    return this.dataSource.getRepository(MissedDeadlineReason).findBy({ caseId: In([...caseIds]) });
  }

  /**
   * The clocks' triggers and stops: when the investigation ended (the first inspection), the summary
   * was first sent, and work began. Work counts as begun when the first work order is completed
   * (ours: the visit has certainly happened then; a booked visit may still fall through). That one
   * moment stops both the safety-work and the supplementary-work clocks, as we do not yet tell the
   * two kinds of work apart.
   */
  async milestones(caseId: number): Promise<{
    investigationEndedAt: Date | null;
    summarySentAt: Date | null;
    safetyWorkStartedAt: Date | null;
    supplementaryWorkStartedAt: Date | null;
  }> {
    const first = await this.dataSource.getRepository(Inspection).findOne({ where: { caseId }, order: { inspectedAt: "ASC" } });
    const summary = await this.dataSource.getRepository(WrittenSummary).findOne({ where: { caseId }, order: { sentAt: "ASC" } });
    const [work] = (await this.dataSource.query(
      "SELECT MIN(completed_at) AS at FROM work_orders WHERE case_id = ? AND status = 'done'",
      [caseId],
    )) as { at: Date | null }[];
    const workBegan = work?.at ? new Date(work.at) : null;
    return {
      investigationEndedAt: first?.inspectedAt ?? null,
      summarySentAt: summary?.sentAt ?? null,
      safetyWorkStartedAt: workBegan,
      supplementaryWorkStartedAt: workBegan,
    };
  }

  /** Sends the written summary to the tenant (after an inspection), recorded with its time. */
  async sendSummary(actor: Actor, caseId: number, body: string): Promise<WrittenSummary> {
    const { saved, deliver, text } = await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      if (!(await m.getRepository(Inspection).existsBy({ caseId: c.id }))) {
        throw new ConflictError("Record the inspection before sending the written summary of it.");
      }
      if (c.tenantUserId === null) throw new ConflictError("This case has no tenant account to send the summary to.");
      const tenant = await this.users.person(c.tenantUserId, m);
      const { outboxId, deliver } = await this.mail.enqueueWithId(m, {
        to: tenant.email,
        template: "writtenSummary",
        organisationId: c.organisationId,
        related: { type: "case", id: c.id },
        data: {
          name: tenant.name,
          reference: c.reference!,
          body,
          link: `${this.config.appUrl}/cases/${c.id}`,
          emergencyPhone: (await this.emergencyPhones?.emergencyPhoneOf(c.organisationId, m)) ?? null,
        },
      });
      const repo = m.getRepository(WrittenSummary);
      const saved = await repo.save(
        repo.create({ caseId: c.id, senderUserId: actor.id, body, outboxId, sentAt: this.clock.now() }),
      );
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "summary-sent",
        after: { summaryId: saved.id, body, outboxId },
      });
      const text = await this.cases.queueText(m, c, "summary-sent", {});
      // The summary closes the investigation: a case not yet investigated follows it there.
      await this.cases.follow(m, c.id, "investigated", "Written summary sent to the tenant.", actor);
      return { saved, deliver, text };
    });
    await deliver();
    await text();
    return saved;
  }
}
