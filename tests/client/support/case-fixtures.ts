// One staff-side case as GET /api/cases/:id answers it, for the workspace and case-works tests.
import { caseResponse, type RoomResponse } from "@/lib/contracts";
import type { CaseStatus } from "@/lib/schemas/case-report";
import { mockReply } from "./api-mock";

const DEFAULT_ROOMS: RoomResponse[] = [
  { id: 1, name: "Living room", kind: "living" },
  { id: 2, name: "Bedroom 1", kind: "bedroom" },
];

export function workspaceCase(over: { status?: CaseStatus; homeRooms?: RoomResponse[] } = {}) {
  return mockReply(caseResponse, {
    id: 42,
    reference: "DW-2026-00042",
    status: over.status ?? "triaged",
    assigneeId: 2,
    hazardClass: "significant",
    hazardClassReason: "Mould in a child's bedroom.",
    tenantUserId: 11,
    channel: "tenant-online",
    awareAt: "2026-01-10T08:00:00.000Z",
    createdAt: "2026-01-10T08:00:00.000Z",
    description: "Black mould in the bedroom corner",
    locations: ["corner"],
    observations: ["mould-spots"],
    since: "months",
    area: "a4",
    vulnerability: ["children-under-15"],
    equipment: { heatingUsable: "yes" },
    property: {
      id: 5,
      addressLine1: "1 Tanner Row",
      addressLine2: null,
      town: "Easterby",
      postcode: "ZX3 1AA",
      estate: "Millbeck Terraces",
    },
    rooms: [{ id: 2, name: "Bedroom 1", kind: "bedroom" }],
    homeRooms: over.homeRooms ?? DEFAULT_ROOMS,
  });
}
