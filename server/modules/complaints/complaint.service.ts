import { Between, type DataSource, type EntityManager } from "typeorm";
import type { ComplaintStatus } from "../../../src/lib/contracts/complaints.js";
import { complaintClocks, type ComplaintStageClock } from "../../../src/lib/domain/complaint-clocks.js";
import {
  describeRemedy,
  fillComplaintLetter,
  type ComplaintLetterKind,
  type ComplaintLetterTemplate,
} from "../../../src/lib/domain/complaint-letters.js";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Config } from "../../config/env.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, NotFoundError, ValidationError } from "../../lib/errors.js";
import { inTransaction } from "../../lib/transaction.js";
import { isStaff, type Actor } from "../auth/actor.js";
import { addressOf, type Case, type CaseService } from "../cases/case.service.js";
import type { MailService } from "../mail/mail.service.js";
import type { OrganisationService } from "../organisations/organisation.service.js";
import type { ComplaintPolicyView, PolicyService } from "../policy/policy.service.js";
import type { UserService } from "../users/user.service.js";
import { Complaint } from "./complaint.entity.js";
import type { ComplaintRemedyInput } from "./complaints.schemas.js";

/** A complaint with both stages' clocks at the moment it was read. */
export interface ComplaintWithClocks {
  complaint: Complaint;
  clocks: [ComplaintStageClock, ComplaintStageClock];
  extensionMaxWorkingDays: number;
}

/** One stage's part of the figures: how its clocks went for the complaints that reached it. */
export interface ComplaintStageFigures {
  reached: number;
  acknowledgedOnTime: number;
  acknowledgedLate: number;
  /** Not acknowledged yet and past due. */
  acknowledgeOverdue: number;
  respondedOnTime: number;
  respondedLate: number;
  respondOverdue: number;
  extensions: number;
}

/** ComplaintService.figures: complaints raised in a period, for the dashboard and the board report. */
export interface ComplaintFigures {
  from: Date;
  to: Date;
  raised: number;
  open: number;
  closed: number;
  /** Closed after the stage 1 response (not escalated). */
  closedAtStage1: number;
  escalated: number;
  stage1: ComplaintStageFigures;
  stage2: ComplaintStageFigures;
  apologies: number;
  compensation: {
    offeredCount: number;
    offeredPence: number;
    acceptedCount: number;
    paidCount: number;
    paidPence: number;
  };
}

const STAGE_OF: Partial<Record<ComplaintStatus, 1 | 2>> = {
  "stage-1-received": 1,
  "stage-1-acknowledged": 1,
  "stage-1-responded": 1,
  "stage-2-received": 2,
  "stage-2-acknowledged": 2,
};

const REMEDY_FIELDS = [
  "apology",
  "apologyText",
  "putRight",
  "compensationOfferedPence",
  "compensationOfferedOn",
  "compensationAcceptedOn",
  "compensationPaidPence",
  "compensationPaidOn",
] as const;

const isDuplicateKey = (error: unknown): boolean => {
  const e = error as { code?: string; errno?: number; driverError?: { code?: string; errno?: number } };
  return (
    e?.code === "ER_DUP_ENTRY" || e?.errno === 1062 || e?.driverError?.code === "ER_DUP_ENTRY" || e?.driverError?.errno === 1062
  );
};

/** "Thursday 14 January 2027": the London day of an instant, for letters. */
const letterDay = (instant: Date): string =>
  new Date(`${localDate(instant)}T12:00:00Z`)
    .toLocaleDateString("en-GB", {
      weekday: "long",
      day: "numeric",
      month: "long",
      year: "numeric",
      timeZone: "UTC",
    })
    .replace(",", "");

type Deliver = () => Promise<unknown>;

/**
 * Formal complaints about a case (the `complaints` table, owned here): raised by the tenant or by staff
 * for them, one open per case (a unique key on `open_case_id`), through stage 1 and stage 2 with their
 * clocks from the landlord's complaint policy. Every move is a conditional UPDATE on the version and
 * status the caller saw (409 otherwise, nothing changed), writes its case event and sends its letter
 * (the landlord's wording, through the outbox) in one transaction.
 *
 * For other modules: `figures(organisationId, from, to)` (the dashboard, the board report) and
 * `historyOfCase(caseId)` (the evidence pack) read without an actor: the caller has checked access.
 */
export class ComplaintService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly policy: PolicyService,
    private readonly mail: MailService,
    private readonly users: UserService,
    private readonly organisations: OrganisationService,
    private readonly clock: Clock,
  ) {}

  /** The case's complaints, newest first, as the actor may see them (a tenant: only their own case's). */
  async listForCase(actor: Actor, caseId: number): Promise<ComplaintWithClocks[]> {
    const c = await this.cases.getForActor(actor, caseId);
    return this.historyOfCase(c.id, c.organisationId);
  }

  /** Every complaint about a case, newest first, with its clocks now (no access check: for the evidence pack). */
  async historyOfCase(caseId: number, organisationId?: number): Promise<ComplaintWithClocks[]> {
    const rows = await this.dataSource.getRepository(Complaint).find({ where: { caseId }, order: { id: "DESC" } });
    if (!rows.length) return [];
    const policy = await this.policy.complaintPolicyFor(organisationId ?? rows[0]!.organisationId);
    const now = this.clock.now();
    return rows.map((complaint) => this.withClocks(complaint, policy, now));
  }

  /** Who raised each complaint, for the replies. */
  async raisers(complaints: readonly Complaint[]) {
    return this.users.people([...new Set(complaints.map((c) => c.raisedByUserId))]);
  }

  /** A complaint about a case: the tenant for their own case, or staff writing it down for them. */
  async raise(actor: Actor, caseId: number, description: string): Promise<ComplaintWithClocks> {
    const { id, deliveries } = await inTransaction(this.dataSource, async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const open = await m.getRepository(Complaint).findOneBy({ openCaseId: c.id });
      if (open) throw this.alreadyOpen();
      const policy = await this.policy.complaintPolicyFor(c.organisationId, m);
      const now = this.clock.now();
      let saved: Complaint;
      try {
        saved = await m.getRepository(Complaint).save(
          m.getRepository(Complaint).create({
            organisationId: c.organisationId,
            caseId: c.id,
            openCaseId: c.id,
            status: "stage-1-received",
            version: 1,
            raisedByUserId: actor.id,
            onBehalf: isStaff(actor),
            description,
            raisedAt: now,
          }),
        );
      } catch (error) {
        // Raised at the same moment by someone else: the unique key on open_case_id keeps one.
        if (isDuplicateKey(error)) throw this.alreadyOpen();
        throw error;
      }
      const [stage1] = this.withClocks(saved, policy, now).clocks;
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-raised",
        after: {
          complaintId: saved.id,
          description,
          onBehalf: saved.onBehalf,
          acknowledgeDueAt: stage1.acknowledgeDueAt!.toISOString(),
        },
      });
      // A tenant's own complaint: the assignee is told, or every active officer while nobody is assigned.
      const deliveries: Deliver[] = [];
      if (!isStaff(actor)) {
        const assignee =
          c.assigneeUserId === null ? null : await this.users.findStaff(c.organisationId, c.assigneeUserId, undefined, m);
        const recipients = assignee ? [assignee] : await this.users.activeStaffOf(c.organisationId, ["officer"], m);
        for (const to of recipients)
          deliveries.push(
            await this.cases.queueMail(m, c, {
              to: to.email,
              template: "complaintRaised",
              data: {
                name: to.name,
                reference: c.reference ?? `case ${c.id}`,
                address: c.property ? addressOf(c.property) : "",
                tenantName: actor.name,
                description,
                acknowledgeBy: letterDay(stage1.acknowledgeDueAt!),
                link: `${this.config.appUrl}/cases/${c.id}`,
              },
            }),
          );
      }
      return { id: saved.id, deliveries };
    });
    for (const deliver of deliveries) await deliver();
    return this.read(id);
  }

  /** Staff acknowledge the stage the complaint is at; the tenant is sent the acknowledgement letter. */
  async acknowledge(actor: Actor, complaintId: number, input: { version: number; note: string | null }) {
    return this.move(actor, complaintId, input.version, async (m, { complaint, c, policy, now }) => {
      const stage = complaint.status === "stage-1-received" ? 1 : complaint.status === "stage-2-received" ? 2 : null;
      if (stage === null) throw new ConflictError(this.cannot(complaint, "acknowledged"));
      const changes: Partial<Complaint> =
        stage === 1
          ? { status: "stage-1-acknowledged", stage1AcknowledgedAt: now }
          : { status: "stage-2-acknowledged", stage2AcknowledgedAt: now };
      const after = await this.update(m, complaint, input.version, changes);
      const clock = this.withClocks(after, policy, now).clocks[stage - 1]!;
      const sent = await this.sendLetter(m, c, after, "acknowledgement", stage, policy, clock);
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-acknowledged",
        after: {
          complaintId: after.id,
          stage,
          note: input.note,
          respondDueAt: clock.respondDueAt!.toISOString(),
          ...sent.event,
        },
      });
      return sent.deliver;
    });
  }

  /** The stage's one extension, up to the policy's maximum, with a reason the tenant is sent. */
  async extend(
    actor: Actor,
    complaintId: number,
    input: { version: number; workingDays: number; reason: string; note: string | null },
  ) {
    return this.move(actor, complaintId, input.version, async (m, { complaint, c, policy, now }) => {
      const stage = complaint.status === "stage-1-acknowledged" ? 1 : complaint.status === "stage-2-acknowledged" ? 2 : null;
      if (stage === null) throw new ConflictError(this.cannot(complaint, "extended (acknowledge it first)"));
      if ((stage === 1 ? complaint.stage1ExtensionDays : complaint.stage2ExtensionDays) !== null)
        throw new ConflictError(`Stage ${stage} has been extended once already: each stage may be extended only once.`);
      if (input.workingDays > policy.extensionMaxWorkingDays)
        throw new ValidationError(`workingDays: the policy allows at most ${policy.extensionMaxWorkingDays} working days.`, [
          { field: "workingDays", message: `At most ${policy.extensionMaxWorkingDays} working days.` },
        ]);
      const changes: Partial<Complaint> =
        stage === 1
          ? { stage1ExtensionDays: input.workingDays, stage1ExtensionReason: input.reason }
          : { stage2ExtensionDays: input.workingDays, stage2ExtensionReason: input.reason };
      const after = await this.update(m, complaint, input.version, changes);
      const clock = this.withClocks(after, policy, now).clocks[stage - 1]!;
      const sent = await this.sendLetter(m, c, after, "extension", stage, policy, clock);
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-extended",
        after: {
          complaintId: after.id,
          stage,
          note: input.note,
          workingDays: input.workingDays,
          reason: input.reason,
          respondDueAt: clock.respondDueAt!.toISOString(),
          ...sent.event,
        },
      });
      return sent.deliver;
    });
  }

  /**
   * The stage's response. At stage 1 the tenant may then escalate (or staff close it); at stage 2 it
   * is the final response, which tells the escalation route, and the complaint closes.
   */
  async respond(actor: Actor, complaintId: number, input: { version: number; response: string; note: string | null }) {
    return this.move(actor, complaintId, input.version, async (m, { complaint, c, policy, now }) => {
      const stage = complaint.status === "stage-1-acknowledged" ? 1 : complaint.status === "stage-2-acknowledged" ? 2 : null;
      if (stage === null) throw new ConflictError(this.cannot(complaint, "responded to (acknowledge it first)"));
      const changes: Partial<Complaint> =
        stage === 1
          ? { status: "stage-1-responded", stage1RespondedAt: now, stage1Response: input.response }
          : { status: "closed", stage2RespondedAt: now, stage2Response: input.response, closedAt: now, openCaseId: null };
      const after = await this.update(m, complaint, input.version, changes);
      const clock = this.withClocks(after, policy, now).clocks[stage - 1]!;
      const final = stage === 2;
      const sent = await this.sendLetter(m, c, after, final ? "final-response" : "stage-response", stage, policy, clock);
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-responded",
        after: { complaintId: after.id, stage, note: input.note, final, response: input.response, ...sent.event },
      });
      return sent.deliver;
    });
  }

  /** Still unhappy after the stage 1 response: the tenant (or staff for them) takes it to stage 2. */
  async escalate(actor: Actor, complaintId: number, input: { version: number; reason: string; note?: string | null }) {
    return this.move(
      actor,
      complaintId,
      input.version,
      async (m, { complaint, c, policy, now }) => {
        if (complaint.status !== "stage-1-responded")
          throw new ConflictError(
            complaint.status === "closed"
              ? "This complaint is closed: raise a new one if something is still wrong."
              : "A complaint goes to stage 2 once the stage 1 response has been sent.",
          );
        const after = await this.update(m, complaint, input.version, {
          status: "stage-2-received",
          escalatedAt: now,
          escalationReason: input.reason,
        });
        const [, stage2] = this.withClocks(after, policy, now).clocks;
        await this.cases.recordEvent(m, {
          caseId: c.id,
          actorId: actor.id,
          type: "complaint-escalated",
          after: {
            complaintId: after.id,
            stage: 2,
            note: input.note ?? null,
            reason: input.reason,
            acknowledgeDueAt: stage2.acknowledgeDueAt!.toISOString(),
          },
        });
        return null;
      },
      { tenantMay: true },
    );
  }

  /** Staff close a complaint after its stage 1 response, when the tenant has not taken it further. */
  async close(actor: Actor, complaintId: number, input: { version: number; note: string | null }) {
    return this.move(actor, complaintId, input.version, async (m, { complaint, c }) => {
      if (complaint.status !== "stage-1-responded")
        throw new ConflictError(
          this.cannot(complaint, "closed here (close it after the stage 1 response; stage 2 closes with its final response)"),
        );
      const after = await this.update(m, complaint, input.version, {
        status: "closed",
        closedAt: this.clock.now(),
        openCaseId: null,
      });
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-closed",
        after: { complaintId: after.id, stage: 1, note: input.note },
      });
      return null;
    });
  }

  /** The remedy (apology, what will be put right, compensation offered, accepted and paid), at any stage. */
  async setRemedy(actor: Actor, complaintId: number, input: ComplaintRemedyInput) {
    return this.move(actor, complaintId, input.version, async (m, { complaint, c }) => {
      const before = Object.fromEntries(REMEDY_FIELDS.map((f) => [f, complaint[f]])) as Pick<
        Complaint,
        (typeof REMEDY_FIELDS)[number]
      >;
      const next = Object.fromEntries(REMEDY_FIELDS.map((f) => [f, input[f]])) as typeof before;
      const after = await this.update(m, complaint, input.version, { ...next, staffNote: input.note ?? complaint.staffNote });
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "complaint-remedy-changed",
        before,
        after: { ...next, complaintId: after.id, note: input.note },
      });
      return null;
    });
  }

  /**
   * Complaints raised in [from, to) by a landlord, with how their clocks went (at the clock's now):
   * counts by stage, acknowledged and responded on time or late, extensions, compensation totals.
   */
  async figures(organisationId: number, from: Date, to: Date): Promise<ComplaintFigures> {
    const rows = await this.dataSource.getRepository(Complaint).find({
      where: { organisationId, raisedAt: Between(from, new Date(to.getTime() - 1)) },
    });
    const policy = await this.policy.complaintPolicyFor(organisationId);
    const now = this.clock.now();
    const stage = (): ComplaintStageFigures => ({
      reached: 0,
      acknowledgedOnTime: 0,
      acknowledgedLate: 0,
      acknowledgeOverdue: 0,
      respondedOnTime: 0,
      respondedLate: 0,
      respondOverdue: 0,
      extensions: 0,
    });
    const figures: ComplaintFigures = {
      from,
      to,
      raised: rows.length,
      open: 0,
      closed: 0,
      closedAtStage1: 0,
      escalated: 0,
      stage1: stage(),
      stage2: stage(),
      apologies: 0,
      compensation: { offeredCount: 0, offeredPence: 0, acceptedCount: 0, paidCount: 0, paidPence: 0 },
    };
    for (const complaint of rows) {
      const { clocks } = this.withClocks(complaint, policy, now);
      if (complaint.status === "closed") figures.closed += 1;
      else figures.open += 1;
      if (complaint.escalatedAt) figures.escalated += 1;
      else if (complaint.status === "closed") figures.closedAtStage1 += 1;
      for (const clock of clocks) {
        if (clock.acknowledge === "not-started") continue;
        const f = clock.stage === 1 ? figures.stage1 : figures.stage2;
        f.reached += 1;
        if (clock.acknowledgedAt) f[clock.acknowledge === "met" ? "acknowledgedOnTime" : "acknowledgedLate"] += 1;
        else if (clock.acknowledge === "missed") f.acknowledgeOverdue += 1;
        if (clock.respondedAt) f[clock.respond === "met" ? "respondedOnTime" : "respondedLate"] += 1;
        else if (clock.respond === "missed") f.respondOverdue += 1;
        if (clock.extensionWorkingDays !== null) f.extensions += 1;
      }
      if (complaint.apology) figures.apologies += 1;
      if (complaint.compensationOfferedPence !== null) {
        figures.compensation.offeredCount += 1;
        figures.compensation.offeredPence += complaint.compensationOfferedPence;
      }
      if (complaint.compensationAcceptedOn !== null) figures.compensation.acceptedCount += 1;
      if (complaint.compensationPaidPence !== null) {
        figures.compensation.paidCount += 1;
        figures.compensation.paidPence += complaint.compensationPaidPence;
      }
    }
    return figures;
  }

  withClocks(complaint: Complaint, policy: ComplaintPolicyView, now: Date): ComplaintWithClocks {
    const clocks = complaintClocks({
      raisedAt: complaint.raisedAt,
      stage1: {
        acknowledgedAt: complaint.stage1AcknowledgedAt,
        extensionWorkingDays: complaint.stage1ExtensionDays,
        respondedAt: complaint.stage1RespondedAt,
      },
      stage2: complaint.escalatedAt
        ? {
            startedAt: complaint.escalatedAt,
            acknowledgedAt: complaint.stage2AcknowledgedAt,
            extensionWorkingDays: complaint.stage2ExtensionDays,
            respondedAt: complaint.stage2RespondedAt,
          }
        : null,
      policy,
      now,
    });
    return { complaint, clocks, extensionMaxWorkingDays: policy.extensionMaxWorkingDays };
  }

  private async read(id: number): Promise<ComplaintWithClocks> {
    const complaint = await this.dataSource.getRepository(Complaint).findOneByOrFail({ id });
    return this.withClocks(complaint, await this.policy.complaintPolicyFor(complaint.organisationId), this.clock.now());
  }

  /**
   * One move, in one transaction: the complaint and its case as the actor may see them (404 otherwise;
   * a tenant only where `tenantMay`), then `work`, whose deliveries run after the commit.
   */
  private async move(
    actor: Actor,
    complaintId: number,
    version: number,
    work: (
      m: EntityManager,
      ctx: { complaint: Complaint; c: Case; policy: ComplaintPolicyView; now: Date },
    ) => Promise<Deliver | null>,
    { tenantMay = false } = {},
  ): Promise<ComplaintWithClocks> {
    const deliver = await inTransaction(this.dataSource, async (m) => {
      const complaint = await m.getRepository(Complaint).findOneBy({ id: complaintId });
      if (!complaint) throw new NotFoundError("No such complaint.");
      // The case decides who may see the complaint: its landlord's staff, or its tenant (404 for anyone else).
      const c = await this.cases.getForActor(actor, complaint.caseId, m).catch((error: unknown) => {
        throw error instanceof NotFoundError ? new NotFoundError("No such complaint.") : error;
      });
      if (!isStaff(actor) && !tenantMay) throw new NotFoundError("No such complaint.");
      if (complaint.version !== version) throw this.stale();
      const policy = await this.policy.complaintPolicyFor(c.organisationId, m);
      return work(m, { complaint, c, policy, now: this.clock.now() });
    });
    if (deliver) await deliver();
    return this.read(complaintId);
  }

  /** The conditional UPDATE: only from the version and status read, so a move made meanwhile wins and this one is a 409. */
  private async update(m: EntityManager, complaint: Complaint, version: number, changes: Partial<Complaint>): Promise<Complaint> {
    const result = await m
      .createQueryBuilder()
      .update(Complaint)
      .set({ ...changes, version: () => "version + 1" })
      .where("id = :id AND version = :version AND status = :status", { id: complaint.id, version, status: complaint.status })
      .execute();
    if (result.affected !== 1) throw this.stale();
    return Object.assign(new Complaint(), complaint, changes, { version: version + 1 });
  }

  /** Fills the landlord's letter and queues it to the tenant in the caller's transaction (none when the case has no tenant). */
  private async sendLetter(
    m: EntityManager,
    c: Case,
    complaint: Complaint,
    kind: ComplaintLetterKind,
    stage: 1 | 2,
    policy: ComplaintPolicyView,
    clock: ComplaintStageClock,
  ): Promise<{ event: { letter: ComplaintLetterTemplate | null; outboxId?: number }; deliver: Deliver | null }> {
    if (c.tenantUserId === null) return { event: { letter: null }, deliver: null };
    const tenant = await this.users.person(c.tenantUserId, m);
    const letter = fillComplaintLetter(policy.letters[kind], {
      tenantName: tenant.name,
      landlordName: await this.organisations.nameOf(c.organisationId, m),
      reference: c.reference ?? `case ${c.id}`,
      stage: String(stage),
      complaint: stage === 1 ? complaint.description : (complaint.escalationReason ?? complaint.description),
      respondBy: clock.respondDueAt ? letterDay(clock.respondDueAt) : "",
      extensionDays: String(clock.extensionWorkingDays ?? ""),
      extensionReason: (stage === 1 ? complaint.stage1ExtensionReason : complaint.stage2ExtensionReason) ?? "",
      response: (stage === 1 ? complaint.stage1Response : complaint.stage2Response) ?? "",
      remedy: describeRemedy(complaint),
      escalationRoute: policy.escalationRoute,
      link: `${this.config.appUrl}/cases/${c.id}`,
    });
    const { outboxId, deliver } = await this.mail.enqueueWithId(m, {
      to: tenant.email,
      template: "complaintLetter",
      organisationId: c.organisationId,
      related: { type: "case", id: c.id },
      data: { name: tenant.name, subject: letter.subject, body: letter.body },
    });
    return { event: { letter, outboxId }, deliver };
  }

  private stale(): ConflictError {
    return new ConflictError("This complaint has changed since you opened it: reload it and try again.");
  }

  private alreadyOpen(): ConflictError {
    return new ConflictError("This case already has an open complaint: add to it, or raise a new one once it is closed.");
  }

  private cannot(complaint: Complaint, what: string): string {
    const stage = STAGE_OF[complaint.status];
    return complaint.status === "closed"
      ? `This complaint is closed and cannot be ${what.split(" (")[0]}.`
      : `At stage ${stage} (${complaint.status}) the complaint cannot be ${what}.`;
  }
}
