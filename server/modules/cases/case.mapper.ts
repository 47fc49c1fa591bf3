import type { z } from "zod";
import type { caseEventEmail, caseEventResponse, caseResponse } from "../../../src/lib/contracts/cases.js";
import type { CaseEvent } from "./case-event.entity.js";
import type { Case } from "./case.entity.js";

export const toCaseDto = (c: Case): z.input<typeof caseResponse> => ({
  id: c.id,
  reference: c.reference,
  status: c.status,
  assigneeId: c.assigneeUserId,
  tenantUserId: c.tenantUserId,
  hazardClass: c.hazardClass,
  hazardClassReason: c.hazardClassReason,
  channel: c.channel,
  awareAt: c.awareAt.toISOString(),
  createdAt: c.createdAt.toISOString(),
  description: c.description,
  locations: c.locations,
  observations: c.observations,
  since: c.since,
  area: c.area,
  vulnerability: c.vulnerability,
  equipment: c.equipment,
  property: c.property
    ? {
        id: c.property.id,
        addressLine1: c.property.addressLine1,
        addressLine2: c.property.addressLine2,
        town: c.property.town,
        postcode: c.property.postcode,
        estate: c.property.estate,
      }
    : { id: c.propertyId },
  rooms: (c.rooms ?? []).map((r) => ({ id: r.id, name: r.name, kind: r.kind })),
  homeRooms: (c.property?.rooms ?? []).map((r) => ({ id: r.id, name: r.name, kind: r.kind })),
});
export type CaseDto = z.input<typeof caseResponse>;

export type CaseEventEmail = z.input<typeof caseEventEmail>;

export const toCaseEventDto = ({
  event,
  actor,
  email,
}: {
  event: CaseEvent;
  actor: { name: string; role: string } | null;
  email: CaseEventEmail | null;
}): z.input<typeof caseEventResponse> => ({
  id: Number(event.id),
  type: event.type,
  at: event.createdAt.toISOString(),
  actor,
  before: event.before,
  after: event.after,
  email,
});
