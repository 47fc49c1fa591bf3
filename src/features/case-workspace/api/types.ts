// The shapes the officer's case workspace reads (inferred from the API contract, src/lib/contracts)
// and the requests it sends.
import type {
  AssessmentResponse,
  CAUSES,
  CaseDeadline as ContractDeadline,
  DEADLINE_STAGES,
  DEADLINE_STATES,
  HAZARD_CLASSES,
  MOULD_EXTENTS,
  CaseResponse,
  InspectionResponse,
  PolicyResponse,
  RelatedCase as ContractRelatedCase,
  SummarySent,
  TriageResponse,
} from "@/lib/contracts";

export type HazardClass = (typeof HAZARD_CLASSES)[number];
export type DeadlineStage = (typeof DEADLINE_STAGES)[number];
export type DeadlineState = (typeof DEADLINE_STATES)[number];
export type Cause = (typeof CAUSES)[number];
export type MouldExtent = (typeof MOULD_EXTENTS)[number];
export type MoistureUnit = "pct" | "wme";

export type WorkspaceRoom = Pick<CaseResponse["rooms"][number], "id" | "name">;

/** The parts of GET /api/cases/:id the workspace reads (the page passes the whole case). */
export type WorkspaceCase = Pick<
  CaseResponse,
  | "id"
  | "reference"
  | "status"
  | "awareAt"
  | "createdAt"
  | "assigneeId"
  | "hazardClass"
  | "hazardClassReason"
  | "property"
  | "rooms"
  | "homeRooms"
>;

/** PATCH /api/cases/:id: one change at a time from the workspace (server/modules/cases/cases.schemas.ts). */
export interface CasePatch {
  status?: string;
  assigneeId?: number | null;
  hazardClass?: HazardClass;
  reason?: string;
}

export type Triage = TriageResponse;
export type TriagePart = Triage["parts"][number];
export type CaseDeadline = ContractDeadline;

export type { StaffMember } from "@/lib/staff";

export type RelatedCase = ContractRelatedCase;

export type Inspection = InspectionResponse;
export type InspectionRoomReading = Inspection["roomReadings"][number];

/** POST /api/cases/:id/inspections (server/modules/inspections/inspections.schemas.ts). */
export type InspectionInput = Pick<Inspection, "inspectedAt" | "cause" | "mouldExtent" | "findings" | "roomReadings">;

/** POST /api/cases/:id/assessments (server/modules/assessments/assessments.schemas.ts). */
export type AssessmentInput = Pick<AssessmentResponse, "likelihood" | "spread" | "justification">;
export type Assessment = AssessmentResponse;

export type DeadlinePolicy = PolicyResponse;

export type SentSummary = SummarySent;
