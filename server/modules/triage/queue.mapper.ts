import type { z } from "zod";
import type { queueItem } from "../../../src/lib/contracts/triage.js";
import type { QueueRow } from "../cases/case-queue.service.js";

const iso = (d: Date | string) => new Date(d).toISOString();

export const toQueueItemDto = (r: QueueRow, rooms: { id: number; name: string }[], now: Date): z.input<typeof queueItem> => {
  const dueAt = r.nextDueAt === null ? null : new Date(r.nextDueAt);
  return {
    id: r.id,
    reference: r.reference,
    status: r.status,
    channel: r.channel,
    awareAt: iso(r.awareAt),
    createdAt: iso(r.createdAt),
    property: {
      id: r.propertyId,
      addressLine1: r.addressLine1,
      town: r.town,
      postcode: r.postcode,
      estate: r.estate,
      block: r.block,
    },
    rooms,
    riskState: r.riskState,
    mouldIndex: r.mouldIndex === null ? null : Number(r.mouldIndex),
    area: r.area,
    vulnerableHousehold: Boolean(Number(r.vulnerableHousehold)),
    hazardClass: r.hazardClass,
    hhsrs: r.hhsrsBand === null ? null : { band: r.hhsrsBand, category: Number(r.hhsrsCategory) as 1 | 2 },
    priority: Number(r.priority),
    nextDeadline: dueAt === null || r.nextStage === null ? null : { stage: r.nextStage, dueAt: dueAt.toISOString() },
    overdue: dueAt !== null && dueAt.getTime() < now.getTime(),
    assignee: r.assigneeId === null || r.assigneeName === null ? null : { id: r.assigneeId, name: r.assigneeName },
  };
};
export type QueueItemDto = z.input<typeof queueItem>;
