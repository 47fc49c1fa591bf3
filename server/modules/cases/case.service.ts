import { In, type DataSource, type EntityManager } from "typeorm";
import type { CaseReport, StaffCaseReport } from "../../../src/lib/schemas/case-report.js";
import type { Config } from "../../config/env.js";
import { CASE_TRANSITIONS, canTransition, transitionNeedsReason } from "../../../src/lib/domain/case-workflow.js";
import { ConflictError, NotFoundError, ValidationError } from "../../lib/errors.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { MailTemplateName } from "../mail/mail-templates.js";
import type { MailService, SendMail } from "../mail/mail.service.js";
import { OutboxEmail } from "../mail/outbox-email.entity.js";
import { Organisation } from "../organisations/organisation.entity.js";
import type { Property } from "../properties/property.entity.js";
import type { PropertyService } from "../properties/property.service.js";
import { Room } from "../properties/room.entity.js";
import { Tenancy } from "../tenancies/tenancy.entity.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import { User } from "../users/user.entity.js";
import { markTriageStale } from "../triage/triage.service.js";
import { CaseEvent } from "./case-event.entity.js";
import { Case } from "./case.entity.js";
import type { CasePatch } from "./cases.schemas.js";
import type { Clock } from "../../lib/clock.js";

export const formatReference = (awareAt: Date, id: number) => `DW-${awareAt.getUTCFullYear()}-${String(id).padStart(5, "0")}`;
export const addressOf = (p: Pick<Property, "addressLine1" | "town" | "postcode">) => `${p.addressLine1}, ${p.town} ${p.postcode}`;

const VULNERABILITY_WORDS: Record<string, string> = {
  "children-under-15": "children under 15",
  "over-65": "someone over 65",
  "breathing-or-immune": "someone with a breathing or immune condition",
  pregnancy: "a pregnancy",
  disability: "someone with a disability",
};

/** "The household includes children under 15, someone over 65." for officers' and operatives' eyes. */
export const householdIncludes = (vulnerability: readonly string[]) => `The household includes ${vulnerability.map((v) => VULNERABILITY_WORDS[v] ?? v).join(", ")}.`;

/** Case lifecycle start, access and history. Every change is written with its CaseEvent in one transaction. */
export class CaseService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly mail: MailService,
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly clock: Clock,
  ) {}

  /**
   * Writes a CaseEvent in the caller's transaction. Every change to a case goes through here, so
   * this is also where the case's triage figures are marked stale (see TriageService).
   */
  async recordEvent(m: EntityManager, e: { caseId: number; actorId: number | null; type: string; before?: Record<string, unknown> | null; after?: Record<string, unknown> | null }) {
    await m.getRepository(CaseEvent).save(
      // created_at from the clock, not the column default: rules compare it with times the clock set (e.g. works done).
      m.getRepository(CaseEvent).create({ caseId: e.caseId, actorUserId: e.actorId, type: e.type, before: e.before ?? null, after: e.after ?? null, createdAt: this.clock.now() }),
    );
    await markTriageStale(m, { caseIds: [e.caseId] });
  }

  /** A tenant reports for their own home; staff log a report on a tenant's behalf with its channel and awareness date. */
  async create(actor: Actor, input: CaseReport | StaffCaseReport): Promise<Case> {
    let property: Property;
    let tenantUserId: number | null;
    let channel: Case["channel"];
    let awareAt: Date;
    if (isStaff(actor)) {
      const staff = input as StaffCaseReport;
      property = await this.properties.getForStaff(actor, staff.propertyId);
      tenantUserId = staff.tenantUserId ?? (await this.currentTenantOf(property.id));
      if (staff.tenantUserId !== undefined && !(await this.livesAt(staff.tenantUserId, property.id))) {
        throw new ValidationError("tenantUserId: that tenant does not live at this home.", [{ field: "tenantUserId", message: "That tenant does not live at this home." }]);
      }
      channel = staff.channel;
      awareAt = new Date(staff.awareAt);
      if (awareAt.getTime() > this.clock.now().getTime() + 60_000) {
        throw new ValidationError("awareAt: the date the landlord became aware cannot be in the future.", [{ field: "awareAt", message: "Cannot be in the future." }]);
      }
    } else {
      const home = await this.tenancies.homeOf(actor);
      const wanted = input.propertyId;
      if (wanted !== undefined && wanted !== home.property.id) throw new NotFoundError("No such home.");
      property = home.property;
      tenantUserId = actor.id;
      channel = "tenant-online";
      awareAt = this.clock.now();
    }
    const roomIds = [...new Set(input.roomIds ?? [])];
    const propertyRooms = new Set((property.rooms ?? []).map((r) => r.id));
    const strange = roomIds.filter((id) => !propertyRooms.has(id));
    if (strange.length) {
      throw new ValidationError("roomIds: choose rooms of this home.", [{ field: "roomIds", message: `Room ${strange.join(", ")} is not part of this home.` }]);
    }

    const { saved, deliveries } = await this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(Case);
      const vulnerability = input.vulnerability === undefined ? null : [...new Set(input.vulnerability)];
      const row = repo.create({
        organisationId: property.organisationId,
        propertyId: property.id,
        reporterUserId: actor.id,
        tenantUserId,
        channel,
        awareAt,
        description: input.description,
        locations: input.locations,
        observations: input.observations,
        since: input.since ?? null,
        area: input.area ?? null,
        vulnerability,
        vulnerableHousehold: (vulnerability?.length ?? 0) > 0,
        equipment: input.equipment ?? null,
        status: "new",
        reference: null,
        officersAlertedAt: null,
        // The report's received time is the clock's, like its awareness date, not the column default.
        createdAt: this.clock.now(),
      });
      const saved = await repo.save(row);
      saved.reference = formatReference(awareAt, saved.id);
      await repo.update(saved.id, { reference: saved.reference });
      if (roomIds.length) {
        await m.createQueryBuilder().relation(Case, "rooms").of(saved.id).add(roomIds);
      }
      // Another case at this home changes the others' recurrence.
      await markTriageStale(m, { propertyId: property.id });
      await this.recordEvent(m, {
        caseId: saved.id,
        actorId: actor.id,
        type: "case-created",
        after: {
          reference: saved.reference,
          status: "new",
          channel,
          awareAt: awareAt.toISOString(),
          description: saved.description,
          locations: saved.locations,
          observations: saved.observations,
          roomIds,
          since: saved.since,
          area: saved.area,
          vulnerability,
        },
      });
      const deliveries: (() => Promise<unknown>)[] = [];
      const organisation = await m.getRepository(Organisation).findOneByOrFail({ id: property.organisationId });
      if (tenantUserId !== null) {
        const tenant = await m.getRepository(User).findOneByOrFail({ id: tenantUserId });
        deliveries.push(
          await this.queueMail(m, saved, {
            to: tenant.email,
            template: "caseAcknowledgement",
            data: { name: tenant.name, reference: saved.reference, address: addressOf(property), link: `${this.config.appUrl}/cases/${saved.id}`, organisationName: organisation.name },
          }),
        );
      }
      if (saved.vulnerableHousehold) {
        const reasons = [householdIncludes(vulnerability!)];
        deliveries.push(...(await this.alertOfficers(m, saved, property, reasons)));
      }
      return { saved, deliveries };
    });
    for (const deliver of deliveries) await deliver();
    return saved;
  }

  /**
   * E-mails every active officer of the case's landlord once per case (the first time a report is
   * risky or vulnerable), inside the caller's transaction; returns the senders to run after commit.
   */
  async alertOfficers(m: EntityManager, c: Case, property: Property, reasons: string[]): Promise<(() => Promise<unknown>)[]> {
    if (c.officersAlertedAt) return [];
    const officers = await m.getRepository(User).findBy({ organisationId: c.organisationId, role: "officer", status: "active" });
    c.officersAlertedAt = this.clock.now();
    await m.getRepository(Case).update(c.id, { officersAlertedAt: c.officersAlertedAt });
    const out: (() => Promise<unknown>)[] = [];
    for (const officer of officers) {
      out.push(
        await this.queueMail(m, c, {
          to: officer.email,
          template: "caseAlert",
          data: { reference: c.reference!, address: addressOf(property), reasons, link: `${this.config.appUrl}/cases/${c.id}` },
        }),
      );
    }
    return out;
  }

  /** Alerts officers in a transaction of its own (used after readings are added). */
  async alertOfficersNow(c: Case, reasons: string[]): Promise<void> {
    const deliveries = await this.dataSource.transaction(async (m) => {
      const fresh = await m.getRepository(Case).findOne({ where: { id: c.id }, lock: { mode: "pessimistic_write" } });
      if (!fresh || fresh.officersAlertedAt) return [];
      return this.alertOfficers(m, fresh, c.property!, reasons);
    });
    for (const d of deliveries) await d();
  }

  /** Queues an e-mail about the case in the caller's transaction and records it on the timeline; returns the sender to run after commit. */
  async queueMail<T extends MailTemplateName>(m: EntityManager, c: Case, mail: Pick<SendMail<T>, "to" | "template" | "data">) {
    const { deliver, outboxId } = await this.mail.enqueueWithId(m, { ...mail, organisationId: c.organisationId, related: { type: "case", id: c.id } });
    await this.recordEvent(m, { caseId: c.id, actorId: null, type: "email-queued", after: { outboxId, to: mail.to, template: mail.template } });
    return deliver;
  }

  private async currentTenantOf(propertyId: number): Promise<number | null> {
    const today = this.clock.now().toISOString().slice(0, 10);
    const row = await this.dataSource
      .getRepository(Tenancy)
      .createQueryBuilder("t")
      .where("t.property_id = :propertyId AND t.start_date <= :today AND (t.end_date IS NULL OR t.end_date >= :today)", { propertyId, today })
      .orderBy("t.start_date", "DESC")
      .getOne();
    return row?.tenantUserId ?? null;
  }

  private async livesAt(tenantUserId: number, propertyId: number): Promise<boolean> {
    return (await this.currentTenantOf(propertyId)) === tenantUserId ||
      (await this.dataSource.getRepository(Tenancy).existsBy({ tenantUserId, propertyId }));
  }

  /**
   * The case if the actor may see it: staff of its landlord, or the tenant it is about.
   * Anything else is a 404, so a case's existence is never revealed.
   */
  async getForActor(actor: Actor, id: number, m: EntityManager = this.dataSource.manager): Promise<Case> {
    const c = await m.getRepository(Case).findOne({ where: { id }, relations: { rooms: true, property: { rooms: true } } });
    const allowed = c && (isStaff(actor) ? c.organisationId === actor.organisationId : c.tenantUserId === actor.id);
    if (!c || !allowed) throw new NotFoundError("No such case.");
    return c;
  }

  async listForTenant(actor: Actor): Promise<Case[]> {
    return this.dataSource.getRepository(Case).find({
      where: { tenantUserId: actor.id },
      relations: { property: true, rooms: true },
      order: { createdAt: "DESC" },
      take: 200,
    });
  }

  async events(actor: Actor, id: number) {
    const c = await this.getForActor(actor, id);
    const all = await this.dataSource.getRepository(CaseEvent).find({ where: { caseId: c.id }, order: { id: "ASC" } });
    const staff = isStaff(actor);
    // Internal notes are for staff only, and so are e-mails to anyone but the tenant themselves.
    const events = staff ? all : all.filter((e) => e.type !== "internal-note" && !(e.type === "email-queued" && e.after?.to !== actor.email));
    const actorIds = [...new Set(events.map((e) => e.actorUserId).filter((v): v is number => v !== null))];
    const users = actorIds.length ? await this.dataSource.getRepository(User).findBy({ id: In(actorIds) }) : [];
    const names = new Map(users.map((u) => [u.id, { name: u.name, role: u.role }]));
    // Staff see each e-mail's delivery as the outbox records it now.
    const outboxIds = staff ? [...new Set(events.map((e) => e.after?.outboxId).filter((v): v is number => typeof v === "number"))] : [];
    const outbox = outboxIds.length ? await this.dataSource.getRepository(OutboxEmail).findBy({ id: In(outboxIds) }) : [];
    const emails = new Map(outbox.map((o) => [o.id, { status: o.status, to: o.toAddress, template: o.template, sentAt: o.sentAt?.toISOString() ?? null, error: o.error }]));
    return events.map((e) => ({
      event: e,
      actor: e.actorUserId === null ? null : (names.get(e.actorUserId) ?? null),
      email: typeof e.after?.outboxId === "number" ? (emails.get(e.after.outboxId) ?? null) : null,
    }));
  }

  /** "It's got worse": recorded on the timeline, and officers are told if they have not been yet. */
  async reportWorse(actor: Actor, id: number, note: string): Promise<void> {
    const deliveries = await this.dataSource.transaction(async (m) => {
      const c = await this.getForActor(actor, id, m);
      await this.recordEvent(m, { caseId: c.id, actorId: actor.id, type: "tenant-got-worse", after: { note } });
      return this.alertOfficers(m, c, c.property!, [`The tenant says it has got worse: "${note}"`]);
    });
    for (const d of deliveries) await d();
  }

  /**
   * Staff change a case's status (only along the workflow: 409 otherwise), assignee or hazard
   * classification. Each change is its own CaseEvent, written with the change in one transaction.
   */
  async update(actor: Actor, id: number, patch: CasePatch): Promise<Case> {
    await this.dataSource.transaction(async (m) => {
      await this.getForActor(actor, id, m);
      const c = await m.getRepository(Case).findOneOrFail({ where: { id }, lock: { mode: "pessimistic_write" } });
      const changes: Partial<Case> = {};
      if (patch.status !== undefined && patch.status !== c.status) {
        if (!canTransition(c.status, patch.status)) {
          throw new ConflictError(`A case that is ${c.status} cannot move to ${patch.status}. From ${c.status} it can move to: ${CASE_TRANSITIONS[c.status].join(", ")}.`, {
            from: c.status,
            to: patch.status,
            allowed: CASE_TRANSITIONS[c.status],
          });
        }
        if (transitionNeedsReason(c.status, patch.status) && !patch.reason) {
          throw new ValidationError("reason: say why the case is being cancelled or reopened.", [{ field: "reason", message: "Say why the case is being cancelled or reopened." }]);
        }
        await this.recordEvent(m, { caseId: c.id, actorId: actor.id, type: "status-changed", before: { status: c.status }, after: { status: patch.status, reason: patch.reason ?? null } });
        changes.status = patch.status;
      }
      if (patch.assigneeId !== undefined && patch.assigneeId !== c.assigneeUserId) {
        if (patch.assigneeId !== null) {
          const assignee = await m.getRepository(User).findOneBy({ id: patch.assigneeId, organisationId: c.organisationId, status: "active" });
          if (!assignee || assignee.role === "tenant") {
            throw new ValidationError("assigneeId: choose an active staff member of this landlord.", [{ field: "assigneeId", message: "Choose an active staff member of this landlord." }]);
          }
        }
        await this.recordEvent(m, { caseId: c.id, actorId: actor.id, type: "assignee-changed", before: { assigneeId: c.assigneeUserId }, after: { assigneeId: patch.assigneeId } });
        changes.assigneeUserId = patch.assigneeId;
      }
      if (patch.hazardClass !== undefined) {
        await this.recordEvent(m, {
          caseId: c.id,
          actorId: actor.id,
          type: "hazard-classified",
          before: { hazardClass: c.hazardClass, reason: c.hazardClassReason },
          after: { hazardClass: patch.hazardClass, reason: patch.reason },
        });
        changes.hazardClass = patch.hazardClass;
        changes.hazardClassReason = patch.reason ?? null;
      }
      if (Object.keys(changes).length) await m.getRepository(Case).update(c.id, changes);
    });
    return this.getForActor(actor, id);
  }

  roomsOf(c: Case): Room[] {
    return c.property?.rooms ?? [];
  }
}
