// The shapes the officer's case workspace reads and sends (server/modules/cases, inspections,
// assessments, policy, and the triage, related and staff routes of the officer journey contract).

export type HazardClass = "emergency" | "significant" | "not-significant";
export type DeadlineStage = "make-safe" | "investigate" | "summary" | "safety-work" | "supplementary-work";
export type DeadlineState = "pending" | "met" | "missed" | "not-applicable";
export type Cause = "condensation" | "penetrating-damp" | "rising-damp" | "plumbing-leak" | "roof-gutter" | "other-unknown";
export type MouldExtent = "none" | "under-1-m2" | "1-to-5-m2" | "over-5-m2";
export type MoistureUnit = "pct" | "wme";

export interface WorkspaceRoom {
  id: number;
  name: string;
}

/** The parts of GET /api/cases/:id the workspace reads (the page passes the whole case). */
export interface WorkspaceCase {
  id: number;
  reference: string | null;
  status: string;
  awareAt: string;
  createdAt: string;
  assigneeId?: number | null;
  hazardClass?: string | null;
  hazardClassReason?: string | null;
  property: { id: number; addressLine1?: string; addressLine2?: string | null; town?: string; postcode?: string; estate?: string };
  rooms: WorkspaceRoom[];
  homeRooms: WorkspaceRoom[];
}

/** PATCH /api/cases/:id: one change at a time from the workspace. */
export interface CasePatch {
  status?: string;
  assigneeId?: number | null;
  hazardClass?: HazardClass;
  reason?: string;
}

export interface TriagePart {
  factor: string;
  points: number;
  max: number;
  explanation: string;
}

export interface Triage {
  score: number;
  parts: TriagePart[];
  computedAt: string;
}

export interface CaseDeadline {
  stage: DeadlineStage | string;
  dueAt: string | null;
  doneAt: string | null;
  state: DeadlineState | string;
}

export type { StaffMember } from "@/lib/staff";

export interface RelatedCase {
  id: number;
  reference: string | null;
  status: string;
  awareAt: string;
  hazardClass: string | null;
  description: string;
}

export interface InspectionRoomReading {
  roomId: number;
  airTemperatureC?: number;
  relativeHumidityPct?: number;
  surfaceTemperaturesC?: number[];
  moisture?: { value: number; unit: MoistureUnit };
  note?: string;
}

/** POST /api/cases/:id/inspections (server/modules/inspections/inspections.schemas.ts). */
export interface InspectionInput {
  inspectedAt: string;
  cause: Cause;
  mouldExtent: MouldExtent;
  findings: string;
  roomReadings: InspectionRoomReading[];
}

export interface Inspection extends InspectionInput {
  id: number;
  caseId?: number;
  inspectorUserId?: number;
  createdAt?: string;
  cause: Cause;
}

export interface AssessmentInput {
  likelihood: number;
  spread: [number, number, number, number];
  justification: string;
}

export interface Assessment extends AssessmentInput {
  id: number;
  version: number;
  /** Cut (not rounded) to two decimals by the server. */
  score: number;
  band: string;
  category: 1 | 2 | number;
  assessorId: number;
  createdAt: string;
}

export interface DeadlinePolicy {
  emergencyMakeSafeHours: number;
  investigateWorkingDays: number;
  summaryWorkingDays: number;
  safetyWorkWorkingDays: number;
  supplementaryWorkWeeks: number;
  source: "default" | "landlord" | string;
}

export interface SentSummary {
  id: number;
  sentAt: string;
}
