import { In, LessThanOrEqual, type DataSource, type EntityManager } from "typeorm";
import type { CaseReport, StaffCaseReport } from "../../../src/lib/schemas/case-report.js";
import type { Config } from "../../config/env.js";
import {
  CASE_TRANSITIONS,
  OPEN_CASE_STATUSES,
  canTransition,
  stepsForward,
  transitionNeedsReason,
  type CaseStatus,
} from "../../../src/lib/domain/case-workflow.js";
import { ConflictError, NotFoundError, ValidationError } from "../../lib/errors.js";
import { inTransaction } from "../../lib/transaction.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { MailTemplateName, SensorFinding } from "../mail/mail-templates.js";
import type { CaseEmailTimeline, MailService, ResentCaseEmail, SendMail } from "../mail/mail.service.js";
import type { OrganisationService } from "../organisations/organisation.service.js";
import type { SmsKind, SmsTexts } from "../sms/sms-texts.js";
import type { SmsService } from "../sms/sms.service.js";
import type { Property, PropertyService, Room } from "../properties/property.service.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import type { UserService } from "../users/user.service.js";
import { CaseEvent } from "./case-event.entity.js";
import { asCaseEvent, type CaseEventOf, type CaseEventType, type NewCaseEvent } from "./case-events.js";
import type { CaseEventListener, NoticedCaseEvent } from "./case-event-listener.js";
import { Case } from "./case.entity.js";
import { CaseMilestone, type CaseMilestoneName } from "./case-milestone.entity.js";
import type { CasePatch } from "./cases.schemas.js";
import type { Clock } from "../../lib/clock.js";
import type { EmergencyPhoneSource } from "../../lib/emergency-phone.js";

/** The case record other modules receive from this service (they never query the entity themselves). */
export type { Case } from "./case.entity.js";

/**
 * The stale mark: the database's own time put a century back, so it is due whatever the clock says
 * (tests and dry runs move the app's clock to other dates) and still differs from one change to the
 * next (a refresh compares it to see whether the case changed meanwhile).
 */
const STALE_MARK = "CURRENT_TIMESTAMP(3) - INTERVAL 100 YEAR";

export const formatReference = (awareAt: Date, id: number) => `DW-${awareAt.getUTCFullYear()}-${String(id).padStart(5, "0")}`;
export const addressOf = (p: Pick<Property, "addressLine1" | "town" | "postcode">) =>
  `${p.addressLine1}, ${p.town} ${p.postcode}`;

const VULNERABILITY_WORDS: Record<string, string> = {
  "children-under-15": "children under 15",
  "over-65": "someone over 65",
  "breathing-or-immune": "someone with a breathing or immune condition",
  pregnancy: "a pregnancy",
  disability: "someone with a disability",
};

/** "The household includes children under 15, someone over 65." for officers' and operatives' eyes. */
export const householdIncludes = (vulnerability: readonly string[]) =>
  `The household includes ${vulnerability.map((v) => VULNERABILITY_WORDS[v] ?? v).join(", ")}.`;

/** Timeline entries about one e-mail: a tenant sees them only for e-mails to themselves. */
const EMAIL_EVENTS: ReadonlySet<string> = new Set<CaseEventType>(["email-queued", "email-resent"]);

/** Timeline entries for staff only: internal notes, and the evidence packs staff made. */
const STAFF_ONLY_EVENTS: ReadonlySet<string> = new Set<CaseEventType>([
  "internal-note",
  "evidence-pack-made",
  "missed-deadline-explained",
  "sensor-alert",
]);

/** Statuses a tenant's "it's got worse" reopens (back to triage). */
export const REOPENED_WHEN_WORSE: readonly CaseStatus[] = ["closed", "cancelled", "monitoring"];

/** What "it's got worse" did: where the case is now, whether it was reopened, and who was e-mailed. */
export interface WorseOutcome {
  status: CaseStatus;
  reopened: boolean;
  told: "assignee" | "officers" | "nobody";
}

/** The triage figures stored on a case for the queue, worked out by TriageService. */
/** One row of the dashboard's clock projection (case_milestones), as TriageService works it out. */
export interface MilestoneFigure {
  milestone: CaseMilestoneName;
  dueAt: Date | null;
  doneAt: Date | null;
  workingDays: number | null;
}

/** What a case opened from a sensor alert holds in place of a tenant's answers. */
export interface SensorCaseInput {
  description: string;
  locations: CaseReport["locations"];
  observations: CaseReport["observations"];
  roomIds?: number[];
  since?: undefined;
  area?: undefined;
  vulnerability?: undefined;
  equipment?: undefined;
}

export type TriageFigures = Pick<
  Case,
  | "riskState"
  | "mouldIndex"
  | "hhsrsBand"
  | "hhsrsCategory"
  | "recurrence"
  | "priority"
  | "nextStage"
  | "nextDueAt"
  | "triageDueAt"
>;

/**
 * Whether the case `alias`'s stored triage figures are due to be worked out again (a change or the
 * clock set `triage_due_at`), as SQL, with `now` the placeholder for the time: for staleIds here, and
 * for the queue's page query, which asks it beside the page (QueueService.list).
 */
export const figuresDue = (alias: string, now: string) => `${alias}.triage_due_at <= ${now}`;

/**
 * Case lifecycle start, access and history. The cases table's one owner: its rows, its status and
 * its stored figures change only here, each change with its CaseEvent in one transaction.
 */
export class CaseService implements CaseEmailTimeline {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly mail: MailService,
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly users: UserService,
    private readonly organisations: OrganisationService,
    private readonly clock: Clock,
  ) {}

  /** Text messages to tenants (SmsService, wired in createServices); without it, nothing is texted. */
  private texts: SmsService | null = null;

  useTexts(texts: SmsService): void {
    this.texts = texts;
  }

  /** Where the landlord's emergency line comes from (PolicyService, wired in createServices: policy depends on cases). */
  private emergencyPhones: EmergencyPhoneSource | null = null;
  useEmergencyPhones(source: EmergencyPhoneSource): void {
    this.emergencyPhones = source;
  }

  /** Who is told about case events in their own transaction (webhooks, wired in createServices). */
  private eventListener: CaseEventListener | null = null;
  useEventListener(listener: CaseEventListener): void {
    this.eventListener = listener;
  }

  /** Tells the listener, if it wants this kind, in the caller's transaction (after the case row's lock, so the same lock order). */
  private async notify(m: EntityManager, caseId: number, event: NoticedCaseEvent, occurredAt: Date): Promise<void> {
    if (!this.eventListener?.wants(event.type)) return;
    const c = await m.getRepository(Case).findOne({ where: { id: caseId }, relations: { property: true } });
    if (!c) return;
    await this.eventListener.caseEventRecorded(m, {
      event,
      occurredAt,
      case: {
        id: c.id,
        organisationId: c.organisationId,
        reference: c.reference,
        // A status change's event is written before the row's status is stored.
        status: event.type === "status-changed" ? event.after.status : c.status,
        hazardClass: c.hazardClass,
        propertyId: c.propertyId,
        uprn: c.property?.uprn ?? null,
      },
    });
  }

  /**
   * Writes a CaseEvent in the caller's transaction. Every change to a case goes through here, so
   * this is also where the case's triage figures are marked stale (see TriageService).
   */
  async recordEvent(m: EntityManager, e: NewCaseEvent): Promise<void> {
    await this.recordEventWithId(m, e);
  }

  /** recordEvent, answering the new event's id (a message that read marks and replies refer to). */
  async recordEventWithId(m: EntityManager, e: NewCaseEvent): Promise<number> {
    const before = "before" in e ? (e.before as Record<string, unknown> | null) : null;
    // The case row first, then its event: the same lock order everywhere (an event's foreign key
    // check takes a shared lock on the case row; taking the exclusive lock second would deadlock).
    await this.markStale(m, { caseIds: [e.caseId] });
    const createdAt = this.clock.now();
    const saved = await m.getRepository(CaseEvent).save(
      // created_at from the clock, not the column default: rules compare it with times the clock set (e.g. works done).
      m.getRepository(CaseEvent).create({
        caseId: e.caseId,
        actorUserId: e.actorId,
        type: e.type,
        before,
        after: e.after as Record<string, unknown>,
        createdAt,
      }),
    );
    await this.notify(m, e.caseId, e, createdAt);
    return Number(saved.id);
  }

  /**
   * Marks cases' triage figures stale inside the caller's transaction (`triage_due_at` = now), so
   * TriageService works them out again: a case changed, another case at its home (recurrence), or
   * every open case of a landlord whose deadline policy changed.
   */
  async markStale(
    m: EntityManager,
    where: { caseIds: number[] } | { propertyId: number } | { organisationId: number },
  ): Promise<void> {
    let ids: number[];
    if ("caseIds" in where) ids = where.caseIds;
    else {
      // Found by a plain (non-locking) read, then updated by primary key in id order. An UPDATE
      // by property or landlord would take next-key locks on that index, and a report being made
      // at the same time (at this home or the next one in the index) deadlocks against them.
      // A case added meanwhile needs no mark: a new case is stale from the start.
      const qb = m.createQueryBuilder(Case, "c").select("c.id", "id");
      if ("propertyId" in where) qb.where("c.property_id = :p", { p: where.propertyId });
      else qb.where("c.organisation_id = :o AND c.status IN (:...open)", { o: where.organisationId, open: OPEN_CASE_STATUSES });
      ids = ((await qb.getRawMany()) as { id: number | string }[]).map((r) => Number(r.id));
    }
    ids = [...new Set(ids)].sort((a, b) => a - b);
    for (let i = 0; i < ids.length; i += 1000) {
      await m
        .createQueryBuilder()
        .update(Case)
        .set({ triageDueAt: () => STALE_MARK })
        .where("id IN (:...ids)", { ids: ids.slice(i, i + 1000) })
        .execute();
    }
  }

  /**
   * The one way a case's status changes: takes the case row's lock, checks the move against the
   * workflow (src/lib/domain/case-workflow.ts), stores the status and writes its `status-changed`
   * event (which marks the triage figures stale) in the caller's transaction.
   *
   * A move the workflow refuses is a 409 and changes nothing; so is a cancel or reopen without a
   * reason (400). With `ifAllowed` (the case following its work: an inspection, a booking, the
   * works done) a refused move is skipped instead. A move to where the case already is changes
   * nothing. Returns the status the case is in afterwards.
   */
  async transition(
    m: EntityManager,
    caseId: number,
    to: CaseStatus,
    reason: string | null,
    actor: Pick<Actor, "id"> | null,
    options: { ifAllowed?: boolean } = {},
  ): Promise<{ from: CaseStatus; status: CaseStatus; moved: boolean }> {
    const c = await this.lockRow(m, caseId);
    const from = c.status;
    if (from === to) return { from, status: from, moved: false };
    if (!canTransition(from, to)) {
      if (options.ifAllowed) return { from, status: from, moved: false };
      throw new ConflictError(
        `A case that is ${from} cannot move to ${to}. From ${from} it can move to: ${CASE_TRANSITIONS[from].join(", ")}.`,
        {
          from,
          to,
          allowed: CASE_TRANSITIONS[from],
        },
      );
    }
    if (transitionNeedsReason(from, to) && !reason) {
      throw new ValidationError("reason: say why the case is being cancelled or reopened.", [
        { field: "reason", message: "Say why the case is being cancelled or reopened." },
      ]);
    }
    await this.recordEvent(m, {
      caseId,
      actorId: actor?.id ?? null,
      type: "status-changed",
      before: { status: from },
      after: { status: to, reason },
    });
    // The move names the status it was judged from: under the row lock it always matches on one
    // server, but a Galera node does not see another node's lock, and there the guard (with the
    // certification conflict that retries the loser, inTransaction) is what keeps a stale move out.
    const moved = await m
      .createQueryBuilder()
      .update(Case)
      .set({ status: to })
      .where("id = :caseId AND status = :from", { caseId, from })
      .execute();
    if (!moved.affected) {
      throw new ConflictError("Someone else changed this case's status a moment ago. Reload the case and try again.", {
        from,
        to,
      });
    }
    return { from, status: to, moved: true };
  }

  /**
   * The case follows its work: walks forward along the main path to `to`, one allowed move at a
   * time, each written as its own status change with `reason` (an inspection recorded on a new case
   * ends investigated, via triaged). With `orBack`, a move that is not forward (back to
   * investigated after a failed fix) is made directly when the workflow allows it; otherwise, and
   * always without `orBack`, the case stays where it is.
   */
  async follow(
    m: EntityManager,
    caseId: number,
    to: CaseStatus,
    reason: string,
    actor: Pick<Actor, "id"> | null,
    options: { orBack?: boolean } = {},
  ): Promise<{ from: CaseStatus; status: CaseStatus; moved: boolean }> {
    const from = (await this.lockRow(m, caseId)).status;
    const steps = stepsForward(from, to);
    if (!steps) {
      if (options.orBack) return this.transition(m, caseId, to, reason, actor, { ifAllowed: true });
      return { from, status: from, moved: false };
    }
    for (const step of steps) await this.transition(m, caseId, step, reason, actor, { ifAllowed: true });
    return { from, status: steps.length ? to : from, moved: steps.length > 0 };
  }

  /** The case row, locked for the rest of the caller's transaction. */
  async lockRow(m: EntityManager, caseId: number): Promise<Case> {
    return m.getRepository(Case).findOneOrFail({ where: { id: caseId }, lock: { mode: "pessimistic_write" } });
  }

  /** The works on the case are done: the monitoring period starts now and runs to `endsAt`. */
  async startMonitoringPeriod(m: EntityManager, caseId: number, worksDoneAt: Date, endsAt: Date): Promise<void> {
    await m.getRepository(Case).update(caseId, { worksDoneAt, monitoringEndsAt: endsAt, monitoringRemindedAt: null });
  }

  /** Cases whose monitoring period has ended and whose reminder has not gone yet. */
  async dueForMonitoringReminder(now: Date, limit = 100): Promise<Case[]> {
    return this.dataSource
      .getRepository(Case)
      .createQueryBuilder("c")
      .where("c.status = 'monitoring' AND c.monitoring_ends_at <= :now AND c.monitoring_reminded_at IS NULL", { now })
      .limit(limit)
      .getMany();
  }

  /** Records that the end-of-monitoring reminder has gone (in the caller's transaction, under the row lock). */
  async markMonitoringReminded(m: EntityManager, caseId: number, at: Date): Promise<void> {
    await m.getRepository(Case).update(caseId, { monitoringRemindedAt: at });
  }

  /**
   * Every landlord's open cases whose next deadline falls at or before `by` (overdue included),
   * soonest first, with their homes' addresses: what the officers' daily digest lists.
   */
  async openDueBy(by: Date): Promise<Case[]> {
    return this.dataSource.getRepository(Case).find({
      select: {
        id: true,
        organisationId: true,
        reference: true,
        assigneeUserId: true,
        hazardClass: true,
        nextStage: true,
        nextDueAt: true,
        property: { id: true, addressLine1: true, town: true, postcode: true },
      },
      where: { status: In([...OPEN_CASE_STATUSES]), nextDueAt: LessThanOrEqual(by) },
      relations: { property: true },
      order: { nextDueAt: "ASC", id: "ASC" },
    });
  }

  /** One case with its rooms and its home's rooms, without an access check (for background work: triage). */
  async findById(id: number): Promise<Case | null> {
    return this.dataSource.getRepository(Case).findOne({ where: { id }, relations: { rooms: true, property: { rooms: true } } });
  }

  /** Cases by id with their homes and the homes' rooms, without an access check (callers have checked the orders they came from). */
  async findByIds(ids: readonly number[]): Promise<Case[]> {
    if (!ids.length) return [];
    return this.dataSource
      .getRepository(Case)
      .find({ where: { id: In([...new Set(ids)]) }, relations: { property: { rooms: true } } });
  }

  /** Other cases of the same landlord at the same home, newest first (at most 49). */
  async relatedTo(c: Case): Promise<Case[]> {
    const all = await this.dataSource
      .getRepository(Case)
      .find({ where: { propertyId: c.propertyId, organisationId: c.organisationId }, order: { awareAt: "DESC" }, take: 50 });
    return all.filter((o) => o.id !== c.id);
  }

  /** Every case of a home of the landlord, open and closed, newest first (the home's page; at most 200). */
  async forHome(organisationId: number, propertyId: number): Promise<Case[]> {
    return this.dataSource
      .getRepository(Case)
      .find({ where: { propertyId, organisationId }, order: { awareAt: "DESC", id: "DESC" }, take: 200 });
  }

  /** Whether another case at the same home became known within `withinMs` of this one (recurrence). */
  async hasOtherCaseNear(c: Pick<Case, "id" | "propertyId" | "awareAt">, withinMs: number): Promise<boolean> {
    return this.dataSource
      .getRepository(Case)
      .createQueryBuilder("o")
      .where("o.property_id = :p AND o.id <> :id AND o.aware_at BETWEEN :from AND :to", {
        p: c.propertyId,
        id: c.id,
        from: new Date(c.awareAt.getTime() - withinMs),
        to: new Date(c.awareAt.getTime() + withinMs),
      })
      .getExists();
  }

  /** Ids of cases whose triage figures are stale (of one landlord, or all), the longest-stale first. */
  async staleIds(organisationId: number | undefined, limit: number): Promise<number[]> {
    const qb = this.dataSource
      .getRepository(Case)
      .createQueryBuilder("c")
      .select("c.id", "id")
      .where(figuresDue("c", ":now"), { now: this.clock.now() });
    if (organisationId !== undefined) qb.andWhere("c.organisation_id = :org", { org: organisationId });
    const rows: { id: number }[] = await qb.orderBy("c.triage_due_at", "ASC").limit(limit).getRawMany();
    return rows.map((r) => r.id);
  }

  /**
   * Stores the triage figures TriageService worked out from facts read when the case was as `seen`.
   * Takes the case row's lock and writes only if the case is unchanged since (its stale mark and
   * updated_at are as they were): a change made meanwhile keeps its stale mark, and the next reader
   * works the figures out again. Returns whether they were written. updated_at is left alone: it
   * stands for real changes to the case, not for its derived figures.
   */
  async storeTriageFigures(
    caseId: number,
    seen: { triageDueAt: Date | null; updatedAt: Date },
    figures: TriageFigures,
    milestones: readonly MilestoneFigure[] = [],
  ): Promise<boolean> {
    return inTransaction(this.dataSource, async (m) => {
      const [row] = (await m.query("SELECT triage_due_at, updated_at FROM cases WHERE id = ? FOR UPDATE", [caseId])) as {
        triage_due_at: Date | null;
        updated_at: Date;
      }[];
      if (!row) return false;
      const time = (d: Date | null) => (d === null ? null : new Date(d).getTime());
      if (time(row.triage_due_at) !== time(seen.triageDueAt) || time(row.updated_at) !== seen.updatedAt.getTime()) return false;
      await m.getRepository(Case).update(caseId, { ...figures, updatedAt: () => "updated_at" } as unknown as Partial<Case>);
      await this.storeMilestones(m, caseId, milestones);
      // The next deadline has passed undone: the listener hears of it (it keeps it to once per case and stage).
      const now = this.clock.now();
      if (figures.nextStage && figures.nextDueAt && figures.nextDueAt.getTime() < now.getTime()) {
        await this.notify(
          m,
          caseId,
          { type: "deadline-missed", after: { stage: figures.nextStage, dueAt: figures.nextDueAt.toISOString() } },
          now,
        );
      }
      return true;
    });
  }

  /**
   * The dashboard's projection of the case's clocks (case_milestones), replaced whole in the
   * transaction that stores next_stage/next_due_at from the same deadlines, so the two never disagree.
   */
  private async storeMilestones(m: EntityManager, caseId: number, milestones: readonly MilestoneFigure[]): Promise<void> {
    const repo = m.getRepository(CaseMilestone);
    await repo.delete({ caseId });
    if (milestones.length === 0) return;
    const [row] = (await m.query("SELECT organisation_id FROM cases WHERE id = ?", [caseId])) as { organisation_id: number }[];
    await repo.insert(milestones.map((x) => ({ ...x, caseId, organisationId: row!.organisation_id })));
  }

  /**
   * A tenant reports for their own home; staff log a report on a tenant's behalf with its channel and
   * awareness date. Answers the new case with its rooms and home, as the actor may see it. Reports made
   * at the same moment (even at one home) each become a case of their own: the reference comes from
   * the case's own auto-increment id, and the transaction is retried if MariaDB picks it as a
   * deadlock victim.
   */
  async create(actor: Actor, input: CaseReport | StaffCaseReport): Promise<Case> {
    let property: Property;
    let tenantUserId: number | null;
    let channel: Case["channel"];
    let awareAt: Date;
    if (isStaff(actor)) {
      const staff = input as StaffCaseReport;
      property = await this.properties.getForStaff(actor, staff.propertyId);
      tenantUserId = staff.tenantUserId ?? (await this.tenancies.currentTenantOf(property.id));
      if (staff.tenantUserId !== undefined && !(await this.livesAt(staff.tenantUserId, property.id))) {
        throw new ValidationError("tenantUserId: that tenant does not live at this home.", [
          { field: "tenantUserId", message: "That tenant does not live at this home." },
        ]);
      }
      channel = staff.channel;
      awareAt = new Date(staff.awareAt);
      if (awareAt.getTime() > this.clock.now().getTime() + 60_000) {
        throw new ValidationError("awareAt: the date the landlord became aware cannot be in the future.", [
          { field: "awareAt", message: "Cannot be in the future." },
        ]);
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
      throw new ValidationError("roomIds: choose rooms of this home.", [
        { field: "roomIds", message: `Room ${strange.join(", ")} is not part of this home.` },
      ]);
    }

    const { saved, deliveries } = await inTransaction(this.dataSource, (m) =>
      this.insertCase(m, actor, { property, tenantUserId, channel, awareAt, input, roomIds }),
    );
    // The outbox rows are committed with the case; a failed send here is retried from the outbox,
    // and must not turn the committed report into an error.
    for (const deliver of deliveries) await deliver().catch(() => undefined);
    return saved;
  }

  /** The report's row, rooms, first event and e-mails, in the caller's transaction; the senders run after commit. */
  private async insertCase(
    m: EntityManager,
    actor: Actor,
    r: {
      property: Property;
      tenantUserId: number | null;
      channel: Case["channel"];
      awareAt: Date;
      input: CaseReport | StaffCaseReport | SensorCaseInput;
      roomIds: number[];
      /** A sensor case: what the sensor saw, told to the tenant instead of the acknowledgement. */
      sensorFindings?: SensorFinding[];
    },
  ): Promise<{ saved: Case; deliveries: (() => Promise<unknown>)[] }> {
    const { property, tenantUserId, channel, awareAt, input, roomIds, sensorFindings } = r;
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
    await this.markStale(m, { propertyId: property.id });
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
    const organisationName = await this.organisations.nameOf(property.organisationId, m);
    if (tenantUserId !== null) {
      const tenant = await this.users.person(tenantUserId, m);
      const data = {
        name: tenant.name,
        reference: saved.reference,
        address: addressOf(property),
        link: `${this.config.appUrl}/cases/${saved.id}`,
        organisationName,
        emergencyPhone: (await this.emergencyPhones?.emergencyPhoneOf(property.organisationId, m)) ?? null,
      };
      deliveries.push(
        await (sensorFindings
          ? this.queueMail(m, saved, {
              to: tenant.email,
              template: "sensorCaseNotice",
              data: { ...data, findings: sensorFindings },
            })
          : this.queueMail(m, saved, { to: tenant.email, template: "caseAcknowledgement", data })),
      );
    }
    if (saved.vulnerableHousehold) {
      const reasons = [householdIncludes(vulnerability!)];
      deliveries.push(...(await this.alertOfficers(m, saved, property, reasons)));
    }
    // Read back before commit: once committed, the report is answered 201 whatever happens next.
    return { saved: await this.getForActor(actor, saved.id, m), deliveries };
  }

  /**
   * A case the landlord opens itself from a sensor alert (channel "sensor"), in the caller's
   * transaction (the sensor-watch module links its alerts in the same one). The landlord became aware
   * when the alert was raised; the tenant living there is told in plain words what the sensor saw.
   */
  async openFromSensor(
    m: EntityManager,
    actor: Actor,
    input: SensorCaseInput & { propertyId: number; awareAt: Date; findings: SensorFinding[] },
  ): Promise<{ saved: Case; deliveries: (() => Promise<unknown>)[] }> {
    const property = await this.properties.getForStaff(actor, input.propertyId);
    const tenantUserId = await this.tenancies.currentTenantOf(property.id);
    const rooms = new Set((property.rooms ?? []).map((x) => x.id));
    const roomIds = [...new Set(input.roomIds ?? [])].filter((id) => rooms.has(id));
    return this.insertCase(m, actor, {
      property,
      tenantUserId,
      channel: "sensor",
      awareAt: input.awareAt,
      input,
      roomIds,
      sensorFindings: input.findings,
    });
  }

  /**
   * E-mails every active officer of the case's landlord once per case (the first time a report is
   * risky or vulnerable), inside the caller's transaction; returns the senders to run after commit.
   */
  async alertOfficers(m: EntityManager, c: Case, property: Property, reasons: string[]): Promise<(() => Promise<unknown>)[]> {
    if (c.officersAlertedAt) return [];
    const officers = await this.users.activeStaffOf(c.organisationId, ["officer"], m);
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
    const deliveries = await inTransaction(this.dataSource, async (m) => {
      const fresh = await this.lockRow(m, c.id).catch(() => null);
      if (!fresh || fresh.officersAlertedAt) return [];
      return this.alertOfficers(m, fresh, c.property!, reasons);
    });
    for (const d of deliveries) await d();
  }

  /** Queues an e-mail about the case in the caller's transaction and records it on the timeline; returns the sender to run after commit. */
  async queueMail<T extends MailTemplateName>(m: EntityManager, c: Case, mail: Pick<SendMail<T>, "to" | "template" | "data">) {
    const { deliver, outboxId } = await this.mail.enqueueWithId(m, {
      ...mail,
      organisationId: c.organisationId,
      related: { type: "case", id: c.id },
    });
    await this.recordEvent(m, {
      caseId: c.id,
      actorId: null,
      type: "email-queued",
      after: { outboxId, to: mail.to, template: mail.template },
    });
    return deliver;
  }

  /**
   * Texts the case's tenant, in the caller's transaction, if they have texts on, and puts it on the
   * timeline; with texts off the timeline says it went by e-mail only (unless `quietWhenOff`).
   * `onceKey`: queue it once only (a reminder per booking). Returns the sender to run after commit
   * (its `queued` says whether a text was queued).
   */
  async queueText<K extends SmsKind>(
    m: EntityManager,
    caseOrId: Case | number,
    kind: K,
    data: Omit<SmsTexts[K], "landlord" | "reference" | "link">,
    { onceKey, quietWhenOff = false }: { onceKey?: string; quietWhenOff?: boolean } = {},
  ): Promise<(() => Promise<void>) & { queued: boolean }> {
    const none = Object.assign(async () => undefined, { queued: false });
    const c = typeof caseOrId === "number" ? await m.getRepository(Case).findOneByOrFail({ id: caseOrId }) : caseOrId;
    if (!this.texts || c.tenantUserId === null) return none;
    const landlord = await this.organisations.nameOf(c.organisationId, m);
    const queued = await this.texts.enqueue(m, {
      organisationId: c.organisationId,
      userId: c.tenantUserId,
      kind,
      data: {
        ...data,
        landlord,
        reference: c.reference ?? `#${c.id}`,
        link: `${this.config.appUrl}/cases/${c.id}`,
      } as SmsTexts[K],
      related: { type: "case", id: c.id },
      onceKey,
    });
    if (queued.queued) {
      await this.recordEvent(m, {
        caseId: c.id,
        actorId: null,
        type: "text-queued",
        after: { outboxSmsId: queued.outboxSmsId, kind, body: queued.body, numberEnding: queued.numberEnding },
      });
      return Object.assign(async () => queued.deliver(), { queued: true });
    }
    if (queued.reason === "texts-off" && !quietWhenOff) {
      await this.recordEvent(m, { caseId: c.id, actorId: null, type: "text-not-sent", after: { kind, reason: "texts-off" } });
    }
    return none;
  }

  /** Staff sent an e-mail about the case again (MailService.resend calls this in its transaction). */
  async recordEmailResent(m: EntityManager, r: ResentCaseEmail): Promise<void> {
    await this.recordEvent(m, {
      caseId: r.caseId,
      actorId: r.actorId,
      type: "email-resent",
      after: { outboxId: r.outboxId, to: r.to, template: r.template, subject: r.subject },
    });
  }

  private async livesAt(tenantUserId: number, propertyId: number): Promise<boolean> {
    return (
      (await this.tenancies.currentTenantOf(propertyId)) === tenantUserId ||
      (await this.tenancies.hasLivedAt(tenantUserId, propertyId))
    );
  }

  /**
   * The case if the actor may see it: staff of its landlord, or the tenant it is about while their
   * tenancy of its home runs (TenancyService decides, by the clock). Anything else is a 404, so a
   * case's existence is never revealed.
   */
  async getForActor(actor: Actor, id: number, m: EntityManager = this.dataSource.manager): Promise<Case> {
    const c = await m.getRepository(Case).findOne({ where: { id }, relations: { rooms: true, property: { rooms: true } } });
    const allowed =
      c &&
      (isStaff(actor)
        ? c.organisationId === actor.organisationId
        : c.tenantUserId === actor.id && (await this.tenancies.livesThereNow(actor.id, c.propertyId, m)));
    if (!c || !allowed) throw new NotFoundError("No such case.");
    return c;
  }

  /** The tenant's own cases at the homes they have a tenancy of today. */
  async listForTenant(actor: Actor): Promise<Case[]> {
    const homes = await this.tenancies.currentHomesOf(actor.id);
    if (homes.length === 0) return [];
    return this.dataSource.getRepository(Case).find({
      where: { tenantUserId: actor.id, propertyId: In(homes) },
      relations: { property: true, rooms: true },
      order: { createdAt: "DESC" },
      take: 200,
    });
  }

  async events(actor: Actor, id: number) {
    const c = await this.getForActor(actor, id);
    const all = await this.dataSource.getRepository(CaseEvent).find({ where: { caseId: c.id }, order: { id: "ASC" } });
    const staff = isStaff(actor);
    // Internal notes and evidence packs are for staff only, and so are e-mails to anyone but the tenant themselves.
    const events = staff
      ? all
      : all.filter((e) => !STAFF_ONLY_EVENTS.has(e.type) && !(EMAIL_EVENTS.has(e.type) && e.after?.to !== actor.email));
    const actorIds = [...new Set(events.map((e) => e.actorUserId).filter((v): v is number => v !== null))];
    const names = new Map([...(await this.users.people(actorIds)).values()].map((u) => [u.id, { name: u.name, role: u.role }]));
    // Staff see each e-mail's delivery as the outbox records it now.
    const outboxIds = staff
      ? [...new Set(events.map((e) => e.after?.outboxId).filter((v): v is number => typeof v === "number"))]
      : [];
    const emails = await this.mail.deliveries(outboxIds);
    // …and each text's, as the text outbox records it.
    const textIds = staff
      ? [...new Set(events.map((e) => e.after?.outboxSmsId).filter((v): v is number => typeof v === "number"))]
      : [];
    const texts = this.texts ? await this.texts.deliveries(textIds) : new Map();
    return events.map((e) => ({
      event: e,
      actor: e.actorUserId === null ? null : (names.get(e.actorUserId) ?? null),
      email: typeof e.after?.outboxId === "number" ? (emails.get(e.after.outboxId) ?? null) : null,
      text: typeof e.after?.outboxSmsId === "number" ? (texts.get(e.after.outboxSmsId) ?? null) : null,
    }));
  }

  /** The case's latest event of one kind, with its typed payload, or null. */
  async latestEvent<T extends CaseEventType>(
    caseId: number,
    type: T,
  ): Promise<(CaseEventOf<T> & { actorUserId: number | null; createdAt: Date }) | null> {
    const row = await this.dataSource.getRepository(CaseEvent).findOne({ where: { caseId, type }, order: { id: "DESC" } });
    const event = row && asCaseEvent(row, type);
    return row && event ? { ...event, actorUserId: row.actorUserId, createdAt: row.createdAt } : null;
  }

  /**
   * "It's got worse", in the tenant's own words (`note`, required):
   * - recorded on the timeline (which marks the triage figures stale; the route re-scores at once,
   *   and the recent worsening itself adds to the priority, src/lib/domain/triage-priority.ts);
   * - a closed, cancelled or monitored case is reopened (back to triage) with the tenant's words as
   *   the reason, so it is back in the officers' queue;
   * - the assignee is e-mailed, or every active officer when nobody is assigned (or the assignee
   *   can no longer sign in).
   * Returns what happened, so the tenant is told only what is true.
   */
  async reportWorse(actor: Actor, id: number, note: string): Promise<WorseOutcome> {
    const { outcome, deliveries } = await inTransaction(this.dataSource, async (m) => {
      const property = (await this.getForActor(actor, id, m)).property!;
      const c = await this.lockRow(m, id);
      await this.recordEvent(m, { caseId: c.id, actorId: actor.id, type: "tenant-got-worse", after: { note } });
      const reason = `The tenant says it has got worse: "${note}"`;
      const reopened = REOPENED_WHEN_WORSE.includes(c.status)
        ? (await this.transition(m, c.id, "triaged", reason, actor, { ifAllowed: true })).moved
        : false;
      const assignee =
        c.assigneeUserId === null ? null : await this.users.findStaff(c.organisationId, c.assigneeUserId, undefined, m);
      const recipients = assignee ? [assignee] : await this.users.activeStaffOf(c.organisationId, ["officer"], m);
      const deliveries: (() => Promise<unknown>)[] = [];
      for (const person of recipients) {
        deliveries.push(
          await this.queueMail(m, c, {
            to: person.email,
            template: "caseWorse",
            data: {
              name: person.name,
              reference: c.reference!,
              address: addressOf(property),
              note,
              reopened,
              link: `${this.config.appUrl}/cases/${c.id}`,
            },
          }),
        );
      }
      const status = (await this.lockRow(m, c.id)).status;
      const told: WorseOutcome["told"] = assignee ? "assignee" : recipients.length ? "officers" : "nobody";
      return { outcome: { status, reopened, told }, deliveries };
    });
    for (const d of deliveries) await d();
    return outcome;
  }

  /**
   * Staff change a case's status (only along the workflow: 409 otherwise), assignee or hazard
   * classification. Each change is its own CaseEvent, written with the change in one transaction.
   */
  async update(actor: Actor, id: number, patch: CasePatch): Promise<Case> {
    await inTransaction(this.dataSource, async (m) => {
      await this.getForActor(actor, id, m);
      const c = await this.lockRow(m, id);
      const changes: Partial<Case> = {};
      if (patch.status !== undefined) await this.transition(m, c.id, patch.status, patch.reason ?? null, actor);
      if (patch.assigneeId !== undefined && patch.assigneeId !== c.assigneeUserId) {
        if (patch.assigneeId !== null) {
          const assignee = await this.users.findStaff(c.organisationId, patch.assigneeId, undefined, m);
          if (!assignee) {
            throw new ValidationError("assigneeId: choose an active staff member of this landlord.", [
              { field: "assigneeId", message: "Choose an active staff member of this landlord." },
            ]);
          }
        }
        await this.recordEvent(m, {
          caseId: c.id,
          actorId: actor.id,
          type: "assignee-changed",
          before: { assigneeId: c.assigneeUserId },
          after: { assigneeId: patch.assigneeId },
        });
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
