// The shapes of the officers' queue (GET /api/cases), bulk changes (POST /api/cases/bulk) and the
// people a case can be assigned to (GET /api/staff): inferred from the API contract (src/lib/contracts).
import type { BulkUpdateResponse, QueueItemResponse, QueuePageResponse } from "@/lib/contracts";
import type { CaseStatus } from "@/lib/schemas/case-report";

export type QueueItem = QueueItemResponse;
export type QueuePage = QueuePageResponse;

export type { StaffMember } from "@/lib/staff";

/** One bulk change: every case gets the same assignee, or moves to the same status. */
export interface BulkUpdate {
  ids: number[];
  /** null takes the cases off whoever has them. */
  assigneeId?: number | null;
  status?: CaseStatus;
  /** Needed when cancelling or reopening. */
  reason?: string;
}

export type BulkUpdateResult = BulkUpdateResponse;
