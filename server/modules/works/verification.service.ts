import type { DataSource } from "typeorm";
import { elementsForReport } from "../../../src/lib/domain/home-elements.js";
import { compareBeforeAfter, type BeforeAfter } from "../../../src/lib/domain/verification.js";
import type { Config } from "../../config/env.js";
import { ConflictError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
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
  outcome: { effective: boolean; note: string; at: string; by: string | null } | null;
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
        }
      : null;
    if (!c.worksDoneAt)
      return { state: "no-works", worksDoneAt: null, monitoringEndsAt: null, monitoringDays, rooms: [], outcome: null };
    const property = c.property!;
    const element = elementsForReport(property, c.locations)[0];
    const rooms: VerificationView["rooms"] = [];
    for (const room of this.cases.roomsOf(c)) {
      const series = await this.readings.seriesFor(c.id, room.id);
      if (series.length === 0) continue;
      rooms.push({
        roomId: room.id,
        roomName: room.name,
        comparison: compareBeforeAfter({
          readings: series,
          worksDoneAt: c.worksDoneAt,
          element,
          surfaceWet: c.observations.includes("wet-patches") || c.observations.includes("leak"),
        }),
      });
    }
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
      outcome,
    };
  }

  /** "Fix effective" closes the case; "not effective" sends it back to investigated with a new work order. */
  async decide(
    actor: Actor,
    caseId: number,
    input: { effective: true; note: string } | { effective: false; note: string; workOrder: WorkOrderCreate },
  ): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const fresh = await this.cases.lockRow(m, c.id);
      if (fresh.status !== "monitoring")
        throw new ConflictError(
          `The fix is judged while the case is being monitored after the works; this case is ${fresh.status}.`,
        );
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "fix-verified",
        after: { effective: input.effective, note: input.note },
      });
      if (input.effective) {
        await this.works.moveCase(m, actor, c, "closed", `Fix effective: ${input.note}`);
      } else {
        await this.works.moveCase(m, actor, c, "investigated", `Fix not effective: ${input.note}`);
        await this.works.create(actor, c.id, input.workOrder, m);
      }
    });
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
