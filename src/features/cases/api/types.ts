// The case shapes the server answers with (server/modules/cases/case.mapper.ts and friends).
import type { PointResult, SeriesResult } from "@/lib/domain";
import type { Area, CaseStatus, Channel, Duration, EquipmentAnswer, Location, Observation, Vulnerability } from "@/lib/schemas/case-report";

export interface CaseRoom {
  id: number;
  name: string;
  kind: string;
}

export interface CaseDto {
  id: number;
  /** Only in the tenant's list (`GET /api/me/cases`). */
  photoCount?: number;
  thumbnailUrl?: string | null;
  /** "DW-2026-00042"; null only for a case still being numbered. */
  reference: string | null;
  status: CaseStatus | string;
  channel: Channel | string;
  awareAt: string;
  createdAt: string;
  description: string;
  locations: (Location | string)[];
  observations: (Observation | string)[];
  since: Duration | string | null;
  area: Area | string | null;
  vulnerability: (Vulnerability | string)[] | null;
  equipment: Partial<Record<"heatingUsable" | "extractorFanWorks" | "trickleVentsOpen", EquipmentAnswer | string>> | null;
  property: { id: number; addressLine1?: string; addressLine2?: string | null; town?: string; postcode?: string; estate?: string };
  rooms: CaseRoom[];
  homeRooms: CaseRoom[];
  /** Staff views: who looks after the case, and how serious the hazard was judged (and why). */
  assigneeId?: number | null;
  hazardClass?: "emergency" | "significant" | "not-significant" | string | null;
  hazardClassReason?: string | null;
  tenantUserId?: number | null;
}

export interface CaseEvent {
  id: number;
  type: string;
  at: string;
  actor: { name: string; role: string } | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  /** Staff only: the e-mail this event queued, and how its sending went. */
  email?: CaseEventEmail | null;
}

export interface CaseEventEmail {
  status: "pending" | "sent" | "failed" | string;
  to: string;
  template: string;
  sentAt: string | null;
  error: string | null;
}

export interface CasePhoto {
  id: number;
  url: string;
  thumbnailUrl: string;
  width: number;
  height: number;
  sha256: string;
  createdAt: string;
}

export interface CaseReading {
  id: number | string;
  roomId: number;
  takenAt: string;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  outdoorTemperatureC: number | null;
  source: "manual" | "import" | string;
}

export interface SurfaceEvaluation {
  element: string;
  label: string;
  result: PointResult;
}

export interface RoomEvaluation {
  roomId: number;
  roomName: string;
  readingsCount: number;
  latest: {
    takenAt: string;
    airTemperatureC: number;
    relativeHumidityPct: number;
    surfaceTemperatureC: number | null;
    outdoorTemperatureC: number | null;
  } | null;
  surfaces: SurfaceEvaluation[];
  series: SeriesResult | null;
}

export interface CaseEvaluation {
  /** The server's sentence that the landlord investigates whatever the readings say. */
  statement: string;
  rooms: RoomEvaluation[];
}

export const caseTitle = (c: Pick<CaseDto, "id" | "reference">) => c.reference ?? `Report ${c.id}`;
