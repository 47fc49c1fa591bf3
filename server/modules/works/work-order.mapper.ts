import type { z } from "zod";
import type { contractorResponse, workOrderResponse } from "../../../src/lib/contracts/works.js";
import { isStaff, type Actor } from "../auth/actor.js";
import { slotInstants } from "./appointment.js";
import type { Contractor } from "./contractor.entity.js";
import type { WorkOrder } from "./work-order.entity.js";
import type { WorkOrderService } from "./work-order.service.js";

type Context = Awaited<ReturnType<WorkOrderService["context"]>>;

export function toWorkOrderDto(w: WorkOrder, ctx: Context, actor: Actor): z.input<typeof workOrderResponse> {
  const c = ctx.cases.get(w.caseId);
  // The context loads every order's case with its home (a foreign key on both), so this cannot happen.
  if (!c?.property) throw new Error(`work order ${w.id}: its case and home were not loaded`);
  const home = c.property;
  const rooms = (home.rooms ?? []).filter((r) => w.roomIds.includes(r.id)).map((r) => ({ id: r.id, name: r.name }));
  const assignee = w.assigneeUserId ? ctx.users.get(w.assigneeUserId) : undefined;
  const contractor = w.contractorId ? ctx.contractors.get(w.contractorId) : undefined;
  const staff = isStaff(actor);
  const bookings = ctx.bookings.get(w.id) ?? [];
  const active = bookings.find((b) => b.state === "active");
  const slot =
    w.slotDate && w.slotWindow
      ? {
          date: w.slotDate,
          window: w.slotWindow,
          startsAt: slotInstants(w.slotDate, w.slotWindow).start.toISOString(),
          endsAt: slotInstants(w.slotDate, w.slotWindow).end.toISOString(),
        }
      : null;
  const completedBy = w.completedById ? ctx.users.get(w.completedById) : undefined;
  return {
    id: w.id,
    caseId: w.caseId,
    caseReference: c.reference,
    status: w.status,
    type: w.type,
    // The operative's description is staff only: the tenant sees the type of work and the rooms.
    ...(staff ? { description: w.description } : {}),
    priority: w.priority,
    targetDate: w.targetDate,
    rooms,
    property: { id: home.id, addressLine1: home.addressLine1, town: home.town, postcode: home.postcode, estate: home.estate },
    assignee: assignee ? { id: assignee.id, name: assignee.name } : null,
    contractor: contractor ? { id: contractor.id, name: contractor.name, ...(staff ? { email: contractor.email } : {}) } : null,
    slot,
    booking: active
      ? { response: active.tenantResponse, reason: active.tenantReason, respondedAt: active.respondedAt?.toISOString() ?? null }
      : null,
    ...(staff
      ? {
          bookings: bookings.map((b) => ({
            id: b.id,
            date: b.slotDate,
            window: b.slotWindow,
            assignee: b.assigneeUserId ? { id: b.assigneeUserId, name: ctx.users.get(b.assigneeUserId)?.name ?? null } : null,
            contractor: b.contractorId ? { id: b.contractorId, name: ctx.contractors.get(b.contractorId)?.name ?? null } : null,
            state: b.state,
            response: b.tenantResponse,
            reason: b.tenantReason,
            createdAt: b.createdAt.toISOString(),
          })),
          accessNotes: ctx.accessNotes.get(w.caseId) ?? null,
        }
      : {}),
    completion: w.completedAt
      ? {
          at: w.completedAt.toISOString(),
          doneOn: w.doneOn,
          earlyReason: staff ? w.earlyReason : null,
          by: completedBy?.name ?? null,
          note: w.completionNote,
          materials: staff ? w.materials : null,
          minutesOnSite: staff ? w.minutesOnSite : null,
          followOn: staff ? w.followOn : null,
        }
      : null,
    createdAt: w.createdAt.toISOString(),
  };
}

export const toContractorDto = (k: Contractor): z.input<typeof contractorResponse> => ({
  id: k.id,
  name: k.name,
  email: k.email,
  phone: k.phone,
  trade: k.trade,
});
