import { In, QueryFailedError, type DataSource, type EntityManager, type QueryDeepPartialEntity } from "typeorm";
import { computeDeadlines } from "../../../src/lib/domain/deadlines.js";
import { addWorkingDays, isWorkingDay, localDate } from "../../../src/lib/domain/working-days.js";
import type { Config } from "../../config/env.js";
import { AppError, ConflictError, NotFoundError, ValidationError } from "../../lib/errors.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import { addressOf, householdIncludes } from "../cases/case.service.js";
import type { InspectionService } from "../inspections/inspection.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import type { Property } from "../properties/property.service.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import type { Person, UserService } from "../users/user.service.js";
import { appointmentIcs, describeDay, describeSlot, halvesOf, slotInstants } from "./appointment.js";
import { WorkOrderBooking } from "./booking.entity.js";
import { Contractor } from "./contractor.entity.js";
import { OperativeSlot } from "./operative-slot.entity.js";
import { WorkOrder, type SlotWindow } from "./work-order.entity.js";
import type { WorkOrderCompletion, WorkOrderCreate, WorkOrderListQuery } from "./works.schemas.js";
import type { Clock } from "../../lib/clock.js";
import { messageLanguage, translator } from "../../lib/i18n.js";
import { inTransaction } from "../../lib/transaction.js";
import { keysetAfter, type KeyTerm, type KeysetPage } from "../../lib/table-export.js";
import type { WorkOrderExportRow } from "../../../src/lib/contracts/exports.js";

export const WORK_WORDS: Record<WorkOrder["type"], string> = {
  "extractor-fan": "extractor fan fitting or repair",
  "fan-upgrade": "extractor fan upgrade (continuous or humidity-controlled)",
  "trickle-vents": "trickle vents fitted or unblocked",
  "door-undercut": "doors undercut for air to flow",
  "piv-unit": "positive input ventilation unit",
  "mould-wash": "mould wash and fungicidal treatment",
  "mould-resistant-decoration": "redecoration with mould-resistant paint",
  insulation: "insulation or thermal-bridge repair",
  "draught-proofing": "draught-proofing",
  heating: "heating repair or upgrade",
  "leak-repair": "leak repair",
  "roof-gutter": "roof, gutter or downpipe repair",
  "damp-proofing": "damp-proof course or render repair",
  other: "repair work",
};

/**
 * What the tenant's calendar entry says about the work, in the tenant's language: the kind of work and
 * the case, never the operative's description (that is for the operative only).
 */
export function tenantIcsText(
  language: string | null | undefined,
  type: WorkOrder["type"],
  reference: string | null,
): { title: string; description: string } {
  const t = translator(messageLanguage(language), "mail");
  const work = t(`work.${type}`);
  return {
    title: t("calendar.title", { work, reference: reference ?? "" }),
    description: t("calendar.description", { work, reference: reference ?? "" }),
  };
}

/** The statuses a case may take a new work order in. */
const ORDERABLE: readonly Case["status"][] = ["investigated", "works-planned"];
const OPEN_ORDER: readonly WorkOrder["status"][] = ["unscheduled", "scheduled", "confirmed", "change-requested"];
const DAY_MS = 86_400_000;

const isDuplicate = (error: unknown) =>
  error instanceof QueryFailedError &&
  ((error.driverError as { code?: string; errno?: number } | undefined)?.code === "ER_DUP_ENTRY" ||
    (error.driverError as { errno?: number })?.errno === 1062);

type Deliveries = (() => Promise<unknown>)[];

/**
 * Work orders: created from an investigated case, scheduled into operatives' half-days (the unique
 * key on operative_slots refuses double-booking), answered by the tenant, completed with evidence.
 * The case's status follows its orders. Every change writes its CaseEvent in the same transaction,
 * and e-mails are queued there and sent after commit.
 */
/** The list's ORDER BY, term by term (fixed SQL, never user text); the id last makes it total, for keyset pages. */
function workOrderSortTerms(q: Pick<WorkOrderListQuery, "sort" | "order">): KeyTerm[] {
  const desc = q.order === "desc";
  const id = { expr: "w.id" };
  switch (q.sort) {
    case "slot":
      return [
        { expr: "w.slot_date IS NULL" },
        { expr: "w.slot_date", desc, nullable: true },
        { expr: "FIELD(w.slot_window, 'am', 'all-day', 'pm')" },
        id,
      ];
    case "target":
      return [{ expr: "w.target_date", desc }, id];
    case "created":
      return [{ expr: "w.created_at", desc }, id];
    case "priority":
      return [{ expr: "FIELD(w.priority, 'emergency', 'urgent', 'routine')", desc }, id];
    case "type":
      return [{ expr: "w.type", desc }, id];
    case "status":
      return [
        { expr: "FIELD(w.status, 'unscheduled', 'change-requested', 'scheduled', 'confirmed', 'done', 'cancelled')", desc },
        id,
      ];
  }
}

/** A row of listAfter's page query. */
interface ExportRowSql {
  id: number;
  case_id: number;
  reference: string | null;
  type: WorkOrder["type"];
  priority: WorkOrder["priority"];
  target_date: string;
  status: WorkOrder["status"];
  created_at: Date;
  slot_date: string | null;
  slot_window: SlotWindow | null;
  address_line1: string;
  town: string;
  postcode: string;
  assignee_name: string | null;
  contractor_name: string | null;
}

const toExportRow = (r: ExportRowSql): WorkOrderExportRow => ({
  id: Number(r.id),
  caseId: Number(r.case_id),
  caseReference: r.reference,
  type: r.type,
  priority: r.priority,
  targetDate: r.target_date,
  status: r.status,
  createdAt: r.created_at.toISOString(),
  property: { addressLine1: r.address_line1, town: r.town, postcode: r.postcode },
  assignee: r.assignee_name === null ? null : { name: r.assignee_name },
  contractor: r.contractor_name === null ? null : { name: r.contractor_name },
  slot: r.slot_date && r.slot_window ? { date: r.slot_date, window: r.slot_window } : null,
});

export class WorkOrderService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly policy: PolicyService,
    private readonly inspections: InspectionService,
    private readonly users: UserService,
    private readonly tenancies: TenancyService,
    private readonly clock: Clock,
  ) {}

  /**
   * Writes a move of the order made from `wo` as it was read: only while its status and booking
   * version (schedule_count) are still those, else a 409 and the caller's transaction rolls back.
   * On one server the row lock already orders the moves; on Galera another node's lock is not
   * seen, and this guard (with the certification conflict) is what keeps the later move out.
   */
  private async moveOn(m: EntityManager, wo: WorkOrder, changes: QueryDeepPartialEntity<WorkOrder>): Promise<void> {
    const moved = await m
      .createQueryBuilder()
      .update(WorkOrder)
      .set(changes)
      .where("id = :id AND status = :status AND schedule_count = :seen", { id: wo.id, status: wo.status, seen: wo.scheduleCount })
      .execute();
    if (!moved.affected) throw new ConflictError("Someone else changed this work order a moment ago. Reload it and try again.");
  }

  /** A work order the actor may see (staff of its landlord, or the tenant of its case); 404 otherwise. */
  async getForActor(actor: Actor, id: number, m: EntityManager = this.dataSource.manager, lock = false): Promise<WorkOrder> {
    const wo = await m
      .getRepository(WorkOrder)
      .findOne({ where: { id }, ...(lock ? { lock: { mode: "pessimistic_write" as const } } : {}) });
    if (!wo) throw new NotFoundError("No such work order.");
    await this.cases.getForActor(actor, wo.caseId, m).catch(() => {
      throw new NotFoundError("No such work order.");
    });
    return wo;
  }

  async create(actor: Actor, caseId: number, input: WorkOrderCreate, outer?: EntityManager): Promise<WorkOrder> {
    const run = async (m: EntityManager) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      if (!ORDERABLE.includes(c.status)) {
        throw new ConflictError(
          c.status === "monitoring" || c.status === "works-done"
            ? "The works on this case are done and being checked. If the fix did not work, record that first: the case goes back to investigated with a new work order."
            : `Work orders are made once the case has been investigated; this case is ${c.status}. Record the inspection first.`,
        );
      }
      const rooms = new Set(this.cases.roomsOf(c).map((r) => r.id));
      const roomIds = [...new Set(input.roomIds ?? c.rooms?.map((r) => r.id) ?? [])];
      const strange = roomIds.filter((r) => !rooms.has(r));
      if (strange.length)
        throw new ValidationError("roomIds: choose rooms of this home.", [
          { field: "roomIds", message: `Room ${strange.join(", ")} is not part of this home.` },
        ]);
      const targetDate = input.targetDate ?? (await this.defaultTargetDate(c));
      const repo = m.getRepository(WorkOrder);
      const saved = await repo.save(
        repo.create({
          organisationId: c.organisationId,
          caseId: c.id,
          type: input.type,
          description: input.description,
          roomIds,
          priority: input.priority ?? (c.hazardClass === "emergency" ? "emergency" : "routine"),
          targetDate,
          status: "unscheduled",
          createdById: actor.id,
        }),
      );
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "work-order-created",
        after: { workOrderId: saved.id, type: saved.type, description: saved.description, targetDate, priority: saved.priority },
      });
      return saved;
    };
    return outer ? run(outer) : this.dataSource.transaction(run);
  }

  /** The safety-work deadline's London date when it is running, else the supplementary work's, else the policy's safety-work days from today. */
  private async defaultTargetDate(c: Case): Promise<string> {
    const { source: _s, monitoringDays: _m, ...policy } = await this.policy.forOrganisation(c.organisationId);
    const milestones = await this.inspections.milestones(c.id);
    const now = this.clock.now();
    const deadlines = computeDeadlines({ hazardClass: c.hazardClass, awareAt: c.awareAt, ...milestones, now, policy });
    const running = (stage: string) =>
      deadlines.find((d) => d.stage === stage && d.dueAt && !d.doneAt && d.state !== "not-applicable");
    const due =
      running("safety-work")?.dueAt ??
      running("make-safe")?.dueAt ??
      running("supplementary-work")?.dueAt ??
      addWorkingDays(now, policy.safetyWorkWorkingDays);
    // A deadline already passed: as soon as possible, which is today.
    return localDate(due.getTime() < now.getTime() ? now : due);
  }

  async listForCase(actor: Actor, caseId: number): Promise<WorkOrder[]> {
    const c = await this.cases.getForActor(actor, caseId);
    return this.dataSource.getRepository(WorkOrder).find({ where: { caseId: c.id }, order: { id: "ASC" } });
  }

  /** The list's filters on `w`: one definition for the screen's pages and the export's. */
  private filtered(actor: Actor, q: Omit<WorkOrderListQuery, "page" | "pageSize">) {
    const qb = this.dataSource
      .getRepository(WorkOrder)
      .createQueryBuilder("w")
      .where("w.organisation_id = :org", { org: actor.organisationId });
    if (q.status?.length) qb.andWhere("w.status IN (:...statuses)", { statuses: q.status });
    if (q.type) qb.andWhere("w.type = :type", { type: q.type });
    if (q.assignee === "me") qb.andWhere("w.assignee_user_id = :me", { me: actor.id });
    else if (q.assignee === "unassigned") qb.andWhere("w.assignee_user_id IS NULL AND w.contractor_id IS NULL");
    else if (q.assignee) qb.andWhere("w.assignee_user_id = :a", { a: Number(q.assignee) });
    if (q.from) qb.andWhere("w.slot_date >= :from", { from: q.from });
    if (q.to) qb.andWhere("w.slot_date <= :to", { to: q.to });
    if (q.caseId) qb.andWhere("w.case_id = :caseId", { caseId: q.caseId });
    qb.orderBy();
    for (const term of workOrderSortTerms(q)) qb.addOrderBy(term.expr, term.desc ? "DESC" : "ASC");
    return qb;
  }

  async list(actor: Actor, q: WorkOrderListQuery): Promise<{ items: WorkOrder[]; total: number }> {
    const [items, total] = await this.filtered(actor, q)
      .skip((q.page - 1) * q.pageSize)
      .take(q.pageSize)
      .getManyAndCount();
    return { items, total };
  }

  /**
   * For exports: the next `limit` orders of the list in its order after the one whose sort values are
   * `after` (null: from the top), and this page's last sort values. A keyset page costs the same deep
   * in the list as at its top, where an offset reads every order before it. Only the exported fields
   * are read, in one query by the page's ids (its case's reference, its home's address, the names of
   * its operative or contractor): no case, home or booking entities per order.
   */
  async listAfter(
    actor: Actor,
    q: Omit<WorkOrderListQuery, "page" | "pageSize">,
    after: readonly unknown[] | null,
    limit: number,
  ): Promise<KeysetPage<WorkOrderExportRow>> {
    const terms = workOrderSortTerms(q);
    const keys = this.filtered(actor, q).select("w.id", "id").limit(limit);
    terms.forEach((term, i) => keys.addSelect(term.expr, `k${i}`));
    if (after) {
      const { sql, params } = keysetAfter(terms, after);
      keys.andWhere(sql, params);
    }
    const page = await keys.getRawMany<Record<string, unknown>>();
    if (!page.length) return { rows: [], last: null };
    const found: ExportRowSql[] = await this.dataSource.query(
      `SELECT w.id, w.case_id, c.reference, w.type, w.priority, DATE_FORMAT(w.target_date, '%Y-%m-%d') AS target_date,
              w.status, w.created_at, DATE_FORMAT(w.slot_date, '%Y-%m-%d') AS slot_date, w.slot_window,
              p.address_line1, p.town, p.postcode, a.name AS assignee_name, k.name AS contractor_name
       FROM work_orders w
       JOIN cases c ON c.id = w.case_id
       JOIN properties p ON p.id = c.property_id
       LEFT JOIN users a ON a.id = w.assignee_user_id
       LEFT JOIN contractors k ON k.id = w.contractor_id
       WHERE w.id IN (?) AND w.organisation_id = ?`,
      [page.map((k) => Number(k.id)), actor.organisationId],
    );
    const byId = new Map(found.map((r) => [Number(r.id), toExportRow(r)]));
    const tail = page.at(-1)!;
    return {
      rows: page.map((k) => byId.get(Number(k.id))).filter((w): w is WorkOrderExportRow => w !== undefined),
      last: terms.map((_, i) => tail[`k${i}`] ?? null),
    };
  }

  /** Books (or re-books) the order into a slot for an operative or a contractor. */
  async schedule(
    actor: Actor,
    id: number,
    input: { assigneeId?: number | null; contractorId?: number | null; slot: { date: string; window: SlotWindow } },
  ): Promise<WorkOrder> {
    const today = localDate(this.clock.now());
    if (input.slot.date < today)
      throw new ValidationError("slot.date: choose today or a later day.", [
        { field: "slot.date", message: "Choose today or a later day." },
      ]);
    // The landlord's operatives work Monday to Friday outside bank holidays (the week board shows those days).
    if (!isWorkingDay(input.slot.date))
      throw new ValidationError(
        `slot.date: ${describeDay(input.slot.date)} is not a working day. Choose a weekday that is not a bank holiday.`,
        [
          {
            field: "slot.date",
            message: `${describeDay(input.slot.date)} is a weekend or a bank holiday in England and Wales. Choose a working day.`,
          },
        ],
      );
    const deliveries: Deliveries = [];
    // Run again as a whole if MariaDB (or Galera's certification) picks it as a deadlock victim;
    // the senders of an attempt that rolled back are dropped with it.
    await inTransaction(this.dataSource, async (m) => {
      deliveries.length = 0;
      const wo = await this.getForActor(actor, id, m, true);
      if (wo.status === "done" || wo.status === "cancelled")
        throw new ConflictError(`This work order is ${wo.status}; it cannot be booked.`);
      const c = await this.cases.getForActor(actor, wo.caseId, m);
      let operative: Person | null = null;
      let contractor: Contractor | null = null;
      if (input.assigneeId) {
        operative = await this.users.findStaff(wo.organisationId, input.assigneeId, ["maintenance"], m);
        if (!operative)
          throw new ValidationError("assigneeId: choose an active operative (a maintenance member of staff) of this landlord.", [
            { field: "assigneeId", message: "Choose an active operative of this landlord." },
          ]);
      } else if (input.contractorId) {
        contractor = await m.getRepository(Contractor).findOneBy({ id: input.contractorId, organisationId: wo.organisationId });
        if (!contractor)
          throw new ValidationError("contractorId: choose one of this landlord's contractors.", [
            { field: "contractorId", message: "Choose one of this landlord's contractors." },
          ]);
      }
      // The old appointment is kept on record and frees its half-days.
      const bookings = m.getRepository(WorkOrderBooking);
      const previous = await bookings.findOneBy({ workOrderId: wo.id, state: "active" });
      if (previous) {
        await m.getRepository(OperativeSlot).delete({ bookingId: previous.id });
        await bookings.update(previous.id, { state: "replaced" });
      }
      const booking = await bookings.save(
        bookings.create({
          workOrderId: wo.id,
          assigneeUserId: operative?.id ?? null,
          contractorId: contractor?.id ?? null,
          slotDate: input.slot.date,
          slotWindow: input.slot.window,
          state: "active",
          createdById: actor.id,
        }),
      );
      if (operative) {
        try {
          await m.getRepository(OperativeSlot).insert(
            halvesOf(input.slot.window).map((half) => ({
              userId: operative!.id,
              slotDate: input.slot.date,
              half,
              bookingId: booking.id,
            })),
          );
        } catch (error) {
          if (!isDuplicate(error)) throw error;
          throw new AppError(
            409,
            "double_booked",
            `${operative.name} is already booked on ${describeSlot(input.slot.date, input.slot.window).replace(/, (morning|afternoon|all day).*$/, "")}, ${input.slot.window === "all-day" ? "for part of that day" : input.slot.window === "am" ? "morning" : "afternoon"}. Choose another slot or operative.`,
          );
        }
      }
      const sequence = wo.scheduleCount;
      // schedule_count is the order's booking version (and the calendar invite's SEQUENCE): two
      // bookings of one order at once cannot both stand (moveOn).
      await this.moveOn(m, wo, {
        status: "scheduled",
        assigneeUserId: operative?.id ?? null,
        contractorId: contractor?.id ?? null,
        slotDate: input.slot.date,
        slotWindow: input.slot.window,
        scheduleCount: () => "schedule_count + 1",
      });
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "work-order-scheduled",
        before: previous ? { date: previous.slotDate, window: previous.slotWindow } : null,
        after: {
          workOrderId: wo.id,
          date: input.slot.date,
          window: input.slot.window,
          assignee: operative?.name ?? null,
          contractor: contractor?.name ?? null,
          rescheduled: Boolean(previous),
        },
      });
      await this.moveCase(m, actor, c, "works-planned", "The works are booked.");
      const property = c.property!;
      const icsFor = (description: string, title = `${WORK_WORDS[wo.type]} (${c.reference})`) =>
        appointmentIcs({
          workOrderId: wo.id,
          sequence,
          date: input.slot.date,
          window: input.slot.window,
          title,
          description,
          location: addressOf(property),
          organiserEmail: this.config.smtp.from.replace(/^.*<|>.*$/g, ""),
        });
      // The work and slot are worded by each message, in its recipient's language.
      const common = {
        reference: c.reference!,
        workType: wo.type,
        slot: { date: input.slot.date, window: input.slot.window },
        address: addressOf(property),
        rescheduled: Boolean(previous),
      };
      if (c.tenantUserId !== null) {
        const tenant = await this.users.person(c.tenantUserId, m);
        const calendar = tenantIcsText(await this.users.tenantLanguage(m, { id: c.tenantUserId }), wo.type, c.reference);
        deliveries.push(
          await this.cases.queueMail(m, c, {
            to: tenant.email,
            template: "appointmentProposed",
            data: {
              ...common,
              ics: icsFor(calendar.description, calendar.title),
              name: tenant.name,
              link: `${this.config.appUrl}/cases/${c.id}`,
              forOperative: false,
              accessNotes: null,
            },
          }),
        );
        deliveries.push(
          await this.cases.queueText(m, c, "appointment-offered", {
            workType: common.workType,
            slot: common.slot,
            rescheduled: common.rescheduled,
          }),
        );
      }
      const worker = operative ?? contractor;
      if (worker) {
        deliveries.push(
          await this.cases.queueMail(m, c, {
            to: worker.email,
            template: "appointmentProposed",
            data: {
              ...common,
              ics: icsFor(wo.description),
              name: worker.name,
              link: `${this.config.appUrl}/cases/${c.id}`,
              forOperative: true,
              accessNotes: await this.accessNotes(m, c),
            },
          }),
        );
      }
    });
    for (const d of deliveries) await d();
    return this.dataSource.getRepository(WorkOrder).findOneByOrFail({ id });
  }

  /**
   * Texts each tenant who has texts on a reminder the day before their appointment (London dates, by
   * the app's clock): once per booking (the text outbox's once-key), not for a booking the tenant has
   * asked to move, nor for one already done or cancelled. Tenants with texts off are not told again on
   * the timeline (the offer's entry already says e-mail only). Returns how many texts were queued.
   */
  async textDueReminders(now = this.clock.now()): Promise<number> {
    const tomorrow = new Date(`${localDate(now)}T12:00:00Z`);
    tomorrow.setUTCDate(tomorrow.getUTCDate() + 1);
    const day = tomorrow.toISOString().slice(0, 10);
    const due = (await this.dataSource.query(
      `SELECT b.id AS bookingId, w.id AS workOrderId
         FROM work_order_bookings b JOIN work_orders w ON w.id = b.work_order_id
        WHERE b.slot_date = ? AND b.state = 'active' AND w.status = 'scheduled'
          AND (b.tenant_response IS NULL OR b.tenant_response <> 'change-requested')`,
      [day],
    )) as { bookingId: number; workOrderId: number }[];
    let queued = 0;
    for (const { bookingId, workOrderId } of due) {
      const deliver = await inTransaction(this.dataSource, async (m) => {
        const wo = await m.getRepository(WorkOrder).findOneByOrFail({ id: Number(workOrderId) });
        const booking = await m.getRepository(WorkOrderBooking).findOneByOrFail({ id: Number(bookingId) });
        return this.cases.queueText(
          m,
          wo.caseId,
          "appointment-reminder",
          { workType: wo.type, slot: { date: booking.slotDate, window: booking.slotWindow } },
          { onceKey: `appointment-reminder:${booking.id}`, quietWhenOff: true },
        );
      });
      if (deliver.queued) queued += 1;
      await deliver();
    }
    return queued;
  }

  /** The tenant confirms the proposed appointment or asks for another slot. */
  async respond(actor: Actor, id: number, input: { response: "confirm" | "another-slot"; reason?: string }): Promise<WorkOrder> {
    if (isStaff(actor)) throw new NotFoundError("No such work order.");
    const deliveries: Deliveries = [];
    // Run again as a whole if MariaDB (or Galera's certification) picks it as a deadlock victim;
    // the senders of an attempt that rolled back are dropped with it.
    await inTransaction(this.dataSource, async (m) => {
      deliveries.length = 0;
      const wo = await this.getForActor(actor, id, m, true);
      const c = await this.cases.getForActor(actor, wo.caseId, m);
      if (c.tenantUserId !== actor.id) throw new NotFoundError("No such work order.");
      if (!["scheduled", "confirmed", "change-requested"].includes(wo.status) || !wo.slotDate || !wo.slotWindow) {
        throw new ConflictError("There is no appointment waiting for your answer on this work.");
      }
      const booking = await m.getRepository(WorkOrderBooking).findOneByOrFail({ workOrderId: wo.id, state: "active" });
      if (input.response === "confirm" && wo.status === "change-requested")
        throw new ConflictError("You have asked for another time; your landlord will offer a new slot.");
      const confirmed = input.response === "confirm";
      await m.getRepository(WorkOrderBooking).update(booking.id, {
        tenantResponse: confirmed ? "confirmed" : "change-requested",
        tenantReason: input.reason ?? null,
        respondedAt: this.clock.now(),
      });
      await this.moveOn(m, wo, { status: confirmed ? "confirmed" : "change-requested" });
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: confirmed ? "booking-confirmed" : "booking-change-requested",
        after: { workOrderId: wo.id, date: wo.slotDate, window: wo.slotWindow, reason: input.reason ?? null },
      });
      const property = c.property!;
      const slotWords = describeSlot(wo.slotDate, wo.slotWindow);
      const worker = wo.assigneeUserId
        ? await this.users.person(wo.assigneeUserId, m)
        : wo.contractorId
          ? await m.getRepository(Contractor).findOneByOrFail({ id: wo.contractorId })
          : null;
      const link = `${this.config.appUrl}/cases/${c.id}`;
      if (confirmed) {
        const [slotDate, slotWindow] = [wo.slotDate, wo.slotWindow];
        const icsFor = (description: string, title = `${WORK_WORDS[wo.type]} (${c.reference})`) =>
          appointmentIcs({
            workOrderId: wo.id,
            sequence: Math.max(0, wo.scheduleCount - 1),
            date: slotDate,
            window: slotWindow,
            title,
            description,
            location: addressOf(property),
            organiserEmail: this.config.smtp.from.replace(/^.*<|>.*$/g, ""),
          });
        const data = {
          reference: c.reference!,
          workType: wo.type,
          slot: { date: slotDate, window: slotWindow },
          address: addressOf(property),
          link,
        };
        const calendar = tenantIcsText(await this.users.tenantLanguage(m, { id: actor.id }), wo.type, c.reference);
        deliveries.push(
          await this.cases.queueMail(m, c, {
            to: actor.email,
            template: "appointmentConfirmed",
            data: {
              ...data,
              ics: icsFor(calendar.description, calendar.title),
              name: actor.name,
            },
          }),
        );
        if (worker)
          deliveries.push(
            await this.cases.queueMail(m, c, {
              to: worker.email,
              template: "appointmentConfirmed",
              data: { ...data, ics: icsFor(wo.description), name: worker.name },
            }),
          );
      } else {
        const lead = (await this.users.people([booking.createdById], m)).get(booking.createdById) ?? null;
        const to = new Map<string, string>();
        if (worker) to.set(worker.email, worker.name);
        if (lead) to.set(lead.email, lead.name);
        for (const [email, name] of to) {
          deliveries.push(
            await this.cases.queueMail(m, c, {
              to: email,
              template: "appointmentChangeRequested",
              data: {
                name,
                reference: c.reference!,
                workWords: WORK_WORDS[wo.type],
                slotWords,
                address: addressOf(property),
                reason: input.reason!,
                link,
              },
            }),
          );
        }
      }
    });
    for (const d of deliveries) await d();
    return this.dataSource.getRepository(WorkOrder).findOneByOrFail({ id });
  }

  /**
   * Records what was done, on the London date the work was actually done (today or earlier; before
   * the booked day only with a confirmed reason). Follow-on work found raises a new, unscheduled
   * order of the same case in the same transaction, so the case stays open for it. The last open
   * order of a case moves it to works-done and into monitoring.
   */
  async complete(actor: Actor, id: number, input: WorkOrderCompletion): Promise<WorkOrder> {
    const now = this.clock.now();
    const today = localDate(now);
    if (input.doneOn > today)
      throw new ValidationError("complete.doneOn: the work cannot be recorded as done on a day still to come.", [
        { field: "complete.doneOn", message: "Enter the day the work was done: today or an earlier day." },
      ]);
    const deliveries: Deliveries = [];
    // Run again as a whole if MariaDB (or Galera's certification) picks it as a deadlock victim;
    // the senders of an attempt that rolled back are dropped with it.
    await inTransaction(this.dataSource, async (m) => {
      deliveries.length = 0;
      const wo = await this.getForActor(actor, id, m, true);
      if (wo.status === "done" || wo.status === "cancelled") throw new ConflictError(`This work order is already ${wo.status}.`);
      const c = await this.cases.getForActor(actor, wo.caseId, m);
      if (input.doneOn < localDate(c.awareAt))
        throw new ValidationError("complete.doneOn: that day is before the problem was reported.", [
          {
            field: "complete.doneOn",
            message: `Enter the day the work was done: on or after ${describeDay(localDate(c.awareAt))}, when the problem was reported.`,
          },
        ]);
      const early = wo.slotDate !== null && input.doneOn < wo.slotDate;
      if (early && !input.earlyReason)
        throw new ValidationError(
          `complete.earlyReason: the visit is booked for ${describeDay(wo.slotDate!)}; say why the work was done before the booked day.`,
          [
            {
              field: "complete.earlyReason",
              message: `The visit is booked for ${describeDay(wo.slotDate!)}. Confirm why the work was done before the booked day.`,
            },
          ],
        );
      // Today: the moment it is recorded; an earlier day: the end of that day's working hours (London).
      const doneAt = input.doneOn === today ? now : slotInstants(input.doneOn, "all-day").end;
      await this.moveOn(m, wo, {
        status: "done",
        completedAt: doneAt,
        completedById: actor.id,
        completionNote: input.note,
        materials: input.materials ?? null,
        minutesOnSite: input.minutesOnSite ?? null,
        followOn: input.followOn || null,
        doneOn: input.doneOn,
        earlyReason: early ? input.earlyReason! : null,
      });
      // Follow-on work found is never dropped: it becomes an order of its own, to book or to cancel with a reason.
      const followOnOrder = input.followOn
        ? await this.create(
            actor,
            c.id,
            { type: input.followOnType ?? "other", description: input.followOn, roomIds: wo.roomIds, priority: wo.priority },
            m,
          )
        : null;
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "work-order-completed",
        after: {
          workOrderId: wo.id,
          note: input.note,
          followOn: input.followOn || null,
          doneOn: input.doneOn,
          earlyReason: early ? input.earlyReason! : null,
          followOnWorkOrderId: followOnOrder?.id ?? null,
        },
      });
      const stillOpen = await m.getRepository(WorkOrder).countBy({ caseId: c.id, status: In([...OPEN_ORDER]) });
      if (stillOpen === 0) deliveries.push(...(await this.startMonitoring(m, actor, c, doneAt)));
    });
    for (const d of deliveries) await d();
    return this.dataSource.getRepository(WorkOrder).findOneByOrFail({ id });
  }

  /** Cancels the order; a booked visit is taken out of the tenant's and the operative's calendars (METHOD:CANCEL). */
  async cancel(actor: Actor, id: number, reason: string): Promise<WorkOrder> {
    const deliveries: Deliveries = [];
    // Run again as a whole if MariaDB (or Galera's certification) picks it as a deadlock victim;
    // the senders of an attempt that rolled back are dropped with it.
    await inTransaction(this.dataSource, async (m) => {
      deliveries.length = 0;
      const wo = await this.getForActor(actor, id, m, true);
      if (wo.status === "done" || wo.status === "cancelled") throw new ConflictError(`This work order is already ${wo.status}.`);
      const booking = await m.getRepository(WorkOrderBooking).findOneBy({ workOrderId: wo.id, state: "active" });
      if (booking) {
        await m.getRepository(OperativeSlot).delete({ bookingId: booking.id });
        await m.getRepository(WorkOrderBooking).update(booking.id, { state: "cancelled" });
      }
      await this.moveOn(m, wo, { status: "cancelled" });
      await this.cases.recordEvent(m, {
        caseId: wo.caseId,
        actorId: actor.id,
        type: "work-order-cancelled",
        after: { workOrderId: wo.id, reason },
      });
      if (!booking) return;
      const c = await this.cases.getForActor(actor, wo.caseId, m);
      const property = c.property!;
      const icsFor = (description: string, title = `${WORK_WORDS[wo.type]} (${c.reference})`) =>
        appointmentIcs({
          workOrderId: wo.id,
          sequence: wo.scheduleCount,
          date: booking.slotDate,
          window: booking.slotWindow,
          title,
          description,
          location: addressOf(property),
          organiserEmail: this.config.smtp.from.replace(/^.*<|>.*$/g, ""),
          cancelled: true,
        });
      const data = {
        reference: c.reference!,
        workType: wo.type,
        slot: { date: booking.slotDate, window: booking.slotWindow },
        address: addressOf(property),
        reason,
        link: `${this.config.appUrl}/cases/${c.id}`,
      };
      // The tenant's calendar entry never carries the operative's description.
      const people: { email: string; name: string; description: string; title?: string }[] = [];
      if (c.tenantUserId !== null)
        people.push({
          ...(await this.users.person(c.tenantUserId, m)),
          ...tenantIcsText(await this.users.tenantLanguage(m, { id: c.tenantUserId }), wo.type, c.reference),
        });
      if (booking.assigneeUserId)
        people.push({ ...(await this.users.person(booking.assigneeUserId, m)), description: wo.description });
      else if (booking.contractorId)
        people.push({
          ...(await m.getRepository(Contractor).findOneByOrFail({ id: booking.contractorId })),
          description: wo.description,
        });
      for (const p of people)
        deliveries.push(
          await this.cases.queueMail(m, c, {
            to: p.email,
            template: "appointmentCancelled",
            data: { ...data, ics: icsFor(p.description, p.title), name: p.name },
          }),
        );
    });
    for (const d of deliveries) await d();
    return this.dataSource.getRepository(WorkOrder).findOneByOrFail({ id });
  }

  /** works-done, then monitoring for the policy's days, with an e-mail to the tenant asking for readings. */
  private async startMonitoring(m: EntityManager, actor: Actor, c: Case, now: Date): Promise<Deliveries> {
    const { monitoringDays } = await this.policy.forOrganisation(c.organisationId);
    // Orders completed without ever being booked: the case passes through works-planned.
    await this.moveCase(m, actor, c, "works-planned", "Works recorded.");
    await this.moveCase(m, actor, c, "works-done", "Every work order is done.");
    const endsAt = new Date(now.getTime() + monitoringDays * DAY_MS);
    await this.cases.startMonitoringPeriod(m, c.id, now, endsAt);
    await this.moveCase(m, actor, c, "monitoring", `Checking the fix with readings for ${monitoringDays} days.`);
    await this.cases.recordEvent(m, {
      caseId: c.id,
      actorId: actor.id,
      type: "monitoring-started",
      after: { worksDoneAt: now.toISOString(), endsAt: endsAt.toISOString(), days: monitoringDays },
    });
    if (c.tenantUserId === null) return [];
    const tenant = await this.users.person(c.tenantUserId, m);
    return [
      await this.cases.queueMail(m, c, {
        to: tenant.email,
        template: "monitoringStarted",
        data: {
          name: tenant.name,
          reference: c.reference!,
          days: monitoringDays,
          endsAt,
          link: `${this.config.appUrl}/cases/${c.id}`,
        },
      }),
    ];
  }

  /** Moves the case along the workflow when it can and is not there yet (c.status is kept current). */
  async moveCase(m: EntityManager, actor: Actor, c: Case, to: Case["status"], reason: string): Promise<void> {
    c.status = (await this.cases.follow(m, c.id, to, reason, actor, { orBack: true })).status;
  }

  /** Household notes and vulnerability in words, for the operative going to the home. */
  async accessNotes(m: EntityManager, c: Case): Promise<string | null> {
    const parts: string[] = [];
    if (c.vulnerability?.length) parts.push(householdIncludes(c.vulnerability));
    const householdNotes = c.tenantUserId ? await this.tenancies.householdNotes(c.propertyId, c.tenantUserId, m) : null;
    if (householdNotes) parts.push(householdNotes);
    return parts.length ? parts.join(" ") : null;
  }

  async bookingsOf(ids: number[]): Promise<Map<number, WorkOrderBooking[]>> {
    const out = new Map<number, WorkOrderBooking[]>();
    if (!ids.length) return out;
    for (const b of await this.dataSource
      .getRepository(WorkOrderBooking)
      .find({ where: { workOrderId: In(ids) }, order: { id: "ASC" } })) {
      out.set(b.workOrderId, [...(out.get(b.workOrderId) ?? []), b]);
    }
    return out;
  }

  /** What the DTOs need besides the orders: cases, homes, rooms, people and contractors, by id. */
  async context(orders: WorkOrder[]) {
    const caseIds = [...new Set(orders.map((o) => o.caseId))];
    const cases = await this.cases.findByIds(caseIds);
    const bookings = await this.bookingsOf(orders.map((o) => o.id));
    const allBookings = [...bookings.values()].flat();
    const userIds = [
      ...new Set(
        [...orders.flatMap((o) => [o.assigneeUserId, o.completedById]), ...allBookings.map((b) => b.assigneeUserId)].filter(
          (v): v is number => v !== null,
        ),
      ),
    ];
    const users = await this.users.people(userIds);
    const contractorIds = [
      ...new Set(
        [...orders.map((o) => o.contractorId), ...allBookings.map((b) => b.contractorId)].filter((v): v is number => v !== null),
      ),
    ];
    const contractors = contractorIds.length
      ? await this.dataSource.getRepository(Contractor).findBy({ id: In(contractorIds) })
      : [];
    const accessNotes = new Map<number, string | null>();
    for (const c of cases) accessNotes.set(c.id, await this.accessNotes(this.dataSource.manager, c));
    return {
      cases: new Map(cases.map((c) => [c.id, c])),
      users,
      contractors: new Map(contractors.map((k) => [k.id, k])),
      bookings,
      accessNotes,
    };
  }

  async contractors(actor: Actor): Promise<Contractor[]> {
    return this.dataSource
      .getRepository(Contractor)
      .find({ where: { organisationId: actor.organisationId }, order: { name: "ASC" } });
  }

  async addContractor(actor: Actor, input: { name: string; email: string; phone?: string; trade?: string }): Promise<Contractor> {
    const repo = this.dataSource.getRepository(Contractor);
    return repo.save(
      repo.create({
        organisationId: actor.organisationId,
        name: input.name,
        email: input.email,
        phone: input.phone ?? null,
        trade: input.trade ?? null,
      }),
    );
  }

  propertyOf(c: Case): Property {
    return c.property!;
  }
}
