import type { DataSource } from "typeorm";
import { elementsForReport } from "../../../src/lib/domain/home-elements.js";
import { compareBeforeAfter, MIN_AFTER_HOURS, type BeforeAfter } from "../../../src/lib/domain/verification.js";
import type { Config } from "../../config/env.js";
import { AppError, ConflictError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import type { ReadingService } from "../readings/reading.service.js";
import type { UserService } from "../users/user.service.js";
import { WorkOrder } from "./work-order.entity.js";
import type { WorkOrderService } from "./work-order.service.js";
import type { WorkOrderCreate } from "./works.schemas.js";
import type { Clock } from "../../lib/clock.js";

export interface VerificationView {
  state: "no-works" | "monitoring" | "ended" | "decided";
  worksDoneAt: string | null;
  monitoringEndsAt: string | null;
  monitoringDays: number;
  rooms: { roomId: number; roomName: string; comparison: BeforeAfter }[];
  /** At least one affected room has enough readings after the works to compare (MIN_AFTER_HOURS): "fix effective" needs this or an override. */
  enoughReadings: boolean;
  /** override: why "fix effective" was recorded without enough readings (staff only; null for the tenant). */
  outcome: { effective: boolean; note: string; at: string; by: string | null; override: string | null } | null;
}

/** Enough readings after the works in at least one affected room to compare (the page's "Not enough readings yet" otherwise). */
const hasEnoughReadings = (rooms: VerificationView["rooms"]) => rooms.some((r) => r.comparison.improved !== null);

/**
 * For the dashboard's "what works": the change in hours a day at ≥ 80 % surface RH (after less before),
 * the mean over the rooms with both rates, to one decimal; null when no room has both.
 */
export function hoursAt80PerDayChange(rooms: VerificationView["rooms"]): number | null {
  const changes = rooms
    .map((r) => [r.comparison.before.hoursAtLeast80PerDay, r.comparison.after.hoursAtLeast80PerDay] as const)
    .filter((pair): pair is readonly [number, number] => pair[0] !== null && pair[1] !== null)
    .map(([before, after]) => after - before);
  if (changes.length === 0) return null;
  return Math.round((changes.reduce((s, v) => s + v, 0) / changes.length) * 10) / 10;
}

/** After the works: readings before against after, the lead's decision, and the end-of-period reminders. */
export class VerificationService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly readings: ReadingService,
    private readonly works: WorkOrderService,
    private readonly policy: PolicyService,
    private readonly logger: Logger,
    private readonly users: UserService,
    private readonly clock: Clock,
  ) {}

  async view(actor: Actor, caseId: number): Promise<VerificationView> {
    const c = await this.cases.getForActor(actor, caseId);
    const { monitoringDays } = await this.policy.forOrganisation(c.organisationId);
    const decided = await this.cases.latestEvent(c.id, "fix-verified");
    // A decision counts for the current works only (a later round of works starts afresh).
    const outcomeEvent = decided && c.worksDoneAt && decided.createdAt >= c.worksDoneAt ? decided : null;
    const by = outcomeEvent?.actorUserId
      ? ((await this.users.people([outcomeEvent.actorUserId])).get(outcomeEvent.actorUserId)?.name ?? null)
      : null;
    const outcome = outcomeEvent
      ? {
          effective: Boolean(outcomeEvent.after.effective),
          note: String(outcomeEvent.after.note ?? ""),
          at: outcomeEvent.createdAt.toISOString(),
          by,
          override: isStaff(actor) ? (outcomeEvent.after.override ?? null) : null,
        }
      : null;
    if (!c.worksDoneAt)
      return {
        state: "no-works",
        worksDoneAt: null,
        monitoringEndsAt: null,
        monitoringDays,
        rooms: [],
        enoughReadings: false,
        outcome: null,
      };
    const rooms = await this.comparisons(c, c.worksDoneAt);
    const state = outcome
      ? "decided"
      : c.monitoringEndsAt && c.monitoringEndsAt.getTime() <= this.clock.now().getTime()
        ? "ended"
        : "monitoring";
    return {
      state,
      worksDoneAt: c.worksDoneAt.toISOString(),
      monitoringEndsAt: c.monitoringEndsAt?.toISOString() ?? null,
      monitoringDays,
      rooms,
      enoughReadings: hasEnoughReadings(rooms),
      outcome,
    };
  }

  /** Before against after for each affected room with readings. */
  private async comparisons(c: Case, worksDoneAt: Date): Promise<VerificationView["rooms"]> {
    const element = elementsForReport(c.property!, c.locations)[0];
    const rooms: VerificationView["rooms"] = [];
    for (const room of this.cases.roomsOf(c)) {
      const series = await this.readings.seriesFor(c.id, room.id);
      if (series.length === 0) continue;
      rooms.push({
        roomId: room.id,
        roomName: room.name,
        comparison: compareBeforeAfter({
          readings: series,
          worksDoneAt,
          element,
          surfaceWet: c.observations.includes("wet-patches") || c.observations.includes("leak"),
        }),
      });
    }
    return rooms;
  }

  /** "Fix effective" closes the case; "not effective" sends it back to investigated with a new work order. */
  async decide(
    actor: Actor,
    caseId: number,
    input:
      | { effective: true; note: string; override?: { reason: string } }
      | { effective: false; note: string; workOrder: WorkOrderCreate },
  ): Promise<void> {
    const deliveries = await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const fresh = await this.cases.lockRow(m, c.id);
      if (fresh.status !== "monitoring")
        throw new ConflictError(
          `The fix is judged while the case is being monitored after the works; this case is ${fresh.status}.`,
        );
      // "Fix effective" needs the readings after the works, or an override whose reason is kept on the timeline.
      const override = input.effective ? (input.override?.reason ?? null) : null;
      const rooms = await this.comparisons(c, fresh.worksDoneAt ?? c.worksDoneAt!);
      if (input.effective && !override && !hasEnoughReadings(rooms)) {
        throw new AppError(
          409,
          "not_enough_readings",
          `There are not enough readings after the works to judge the fix (at least ${MIN_AFTER_HOURS} hours in an affected room). Wait for the readings, or record the decision with a reason for going without them (override.reason).`,
          [{ field: "override.reason", message: "Say why the fix can be judged without the readings." }],
        );
      }
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "fix-verified",
        after: {
          effective: input.effective,
          note: input.note,
          ...(override ? { override } : {}),
          hoursAt80PerDayChange: hoursAt80PerDayChange(rooms),
        },
      });
      if (input.effective) {
        await this.works.moveCase(
          m,
          actor,
          c,
          "closed",
          override
            ? `Fix effective, recorded without enough readings (${override}): ${input.note}`
            : `Fix effective: ${input.note}`,
        );
        // The lead's screen says the tenant is told: an e-mail, queued with the decision.
        if (c.status === "closed" && fresh.tenantUserId) {
          const tenant = await this.users.person(fresh.tenantUserId, m);
          return [
            await this.cases.queueMail(m, fresh, {
              to: tenant.email,
              template: "fixConfirmed",
              data: { name: tenant.name, reference: fresh.reference!, link: `${this.config.appUrl}/cases/${c.id}` },
            }),
          ];
        }
        return [];
      } else {
        await this.works.moveCase(m, actor, c, "investigated", `Fix not effective: ${input.note}`);
        await this.works.create(actor, c.id, input.workOrder, m);
        return [];
      }
    });
    for (const d of deliveries) await d();
  }

  /** When a monitoring period has ended: remind the tenant to add readings and tell the lead to decide. Once per period. */
  async sendDueReminders(now = this.clock.now()): Promise<number> {
    const due = await this.cases.dueForMonitoringReminder(now, 100);
    let sent = 0;
    for (const c of due) {
      try {
        const deliveries = await this.dataSource.transaction(async (m) => {
          const fresh = await this.cases.lockRow(m, c.id).catch(() => null);
          if (!fresh || fresh.monitoringRemindedAt) return [];
          await this.cases.markMonitoringReminded(m, c.id, now);
          const link = `${this.config.appUrl}/cases/${c.id}`;
          const readingsAfter = await this.readings.countSince(c.id, fresh.worksDoneAt!, m);
          const out: (() => Promise<unknown>)[] = [];
          if (fresh.tenantUserId) {
            const tenant = await this.users.person(fresh.tenantUserId, m);
            out.push(
              await this.cases.queueMail(m, fresh, {
                to: tenant.email,
                template: "monitoringEnded",
                data: { name: tenant.name, reference: fresh.reference!, link, forLead: false, readingsAfter },
              }),
            );
          }
          // The leads: whoever completed or booked the works.
          const orders = await m.getRepository(WorkOrder).findBy({ caseId: c.id });
          const leadIds = [
            ...new Set(orders.flatMap((o) => [o.completedById, o.createdById]).filter((v): v is number => v !== null)),
          ];
          for (const lead of await this.users.activeStaffOf(fresh.organisationId, ["maintenance", "admin"], m, leadIds)) {
            out.push(
              await this.cases.queueMail(m, fresh, {
                to: lead.email,
                template: "monitoringEnded",
                data: { name: lead.name, reference: fresh.reference!, link, forLead: true, readingsAfter },
              }),
            );
          }
          return out;
        });
        for (const d of deliveries) await d();
        sent++;
      } catch (error) {
        this.logger.error({ err: error, caseId: c.id }, "monitoring reminder failed");
      }
    }
    return sent;
  }
}
