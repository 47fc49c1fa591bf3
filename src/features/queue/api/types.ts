// The shapes of the officers' queue (GET /api/cases), bulk changes (POST /api/cases/bulk) and the
// people a case can be assigned to (GET /api/staff), as the officer-journey contract sets them out.
import type { DeadlineStage, HazardClass } from "@/lib/domain/deadlines";
import type { SurfaceState } from "@/lib/domain";
import type { Area, CaseStatus } from "@/lib/schemas/case-report";

export interface QueueItem {
  id: number;
  /** "DW-2026-00042"; null only for a case still being numbered. */
  reference: string | null;
  status: CaseStatus | string;
  channel: string;
  awareAt: string;
  createdAt: string;
  property: { id: number; addressLine1: string; town: string; postcode: string; estate: string; block: string | null };
  rooms: { id: number; name: string }[];
  /** The worst surface's state; null while the case has no readings. */
  riskState: SurfaceState | null;
  /** VTT mould index, 0 to 6; null when none has been worked out. */
  mouldIndex: number | null;
  area: Area | null;
  vulnerableHousehold: boolean;
  hazardClass: HazardClass | null;
  /** The latest HHSRS assessment; null before the first. */
  hhsrs: { band: string; category: 1 | 2 } | null;
  /** Triage priority, 0 to 100. */
  priority: number;
  nextDeadline: { stage: DeadlineStage | string; dueAt: string } | null;
  overdue: boolean;
  assignee: { id: number; name: string } | null;
}

export interface QueuePage {
  items: QueueItem[];
  total: number;
  page: number;
  pageSize: number;
}

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

export interface BulkUpdateResult {
  updated: number[];
  failed: { id: number; reference: string | null; message: string }[];
}
