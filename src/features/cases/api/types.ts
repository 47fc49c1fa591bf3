// The case shapes the server answers with: inferred from the API contract (src/lib/contracts), never copied.
import type {
  CaseEventEmail,
  CaseEventResponse,
  CaseResponse,
  EvaluationResponse,
  MyCaseResponse,
  PhotoResponse,
  ReadingResponse,
  RoomEvaluationResponse,
} from "@/lib/contracts";

export type CaseRoom = CaseResponse["rooms"][number];
/** A case; the tenant's list (`GET /api/me/cases`) adds its photo count and first thumbnail. */
export type CaseDto = CaseResponse & Partial<Pick<MyCaseResponse, "photoCount" | "thumbnailUrl">>;
export type CaseEvent = CaseEventResponse;
export type { CaseEventEmail };
export type CasePhoto = PhotoResponse;
export type CaseReading = ReadingResponse;
export type RoomEvaluation = RoomEvaluationResponse;
export type SurfaceEvaluation = RoomEvaluation["surfaces"][number];
export type CaseEvaluation = EvaluationResponse;

export const caseTitle = (c: Pick<CaseDto, "id" | "reference">) => c.reference ?? `Report ${c.id}`;
