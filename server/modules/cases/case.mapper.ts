import type { z } from "zod";
import type { caseEventEmail, caseEventResponse, caseEventText, caseResponse } from "../../../src/lib/contracts/cases.js";
import type { CaseEvent } from "./case-event.entity.js";
import type { CaseEventType } from "./case-events.js";
import type { Case } from "./case.entity.js";

/** Who reads the reply: staff see everything; the tenant never sees staff-only text. */
export type Audience = "staff" | "tenant";

export const toCaseDto = (c: Case, audience: Audience = "staff"): z.input<typeof caseResponse> => ({
  id: c.id,
  reference: c.reference,
  status: c.status,
  assigneeId: c.assigneeUserId,
  tenantUserId: c.tenantUserId,
  hazardClass: c.hazardClass,
  // The officer's reason for the classification is staff-only.
  hazardClassReason: audience === "staff" ? c.hazardClassReason : null,
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
export type CaseEventText = z.input<typeof caseEventText>;

/**
 * Payload fields of the timeline that hold staff-only text (the operative's description, officers'
 * reasons, follow-on notes, an override's reason): left out of the tenant's timeline.
 */
const STAFF_ONLY_FIELDS: Partial<Record<CaseEventType, readonly string[]>> = {
  "status-changed": ["reason"],
  "hazard-classified": ["reason"],
  "work-order-created": ["description"],
  "work-order-completed": ["followOn", "earlyReason"],
  "fix-verified": ["override"],
  "complaint-acknowledged": ["note"],
  "complaint-extended": ["note"],
  "complaint-responded": ["note"],
  "complaint-escalated": ["note"],
  "complaint-closed": ["note"],
  "complaint-remedy-changed": ["note"],
};

const withoutFields = (payload: Record<string, unknown> | null, fields: readonly string[] | undefined) =>
  payload && fields ? Object.fromEntries(Object.entries(payload).filter(([k]) => !fields.includes(k))) : payload;

export const toCaseEventDto = (
  {
    event,
    actor,
    email,
    text = null,
  }: {
    event: CaseEvent;
    actor: { name: string; role: string } | null;
    email: CaseEventEmail | null;
    text?: CaseEventText | null;
  },
  audience: Audience = "staff",
): z.input<typeof caseEventResponse> => {
  const hidden = audience === "tenant" ? STAFF_ONLY_FIELDS[event.type as CaseEventType] : undefined;
  return {
    id: Number(event.id),
    type: event.type,
    at: event.createdAt.toISOString(),
    actor,
    before: withoutFields(event.before, hidden),
    after: withoutFields(event.after, hidden),
    email,
    text,
  };
};
