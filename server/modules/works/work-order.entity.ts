import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from "typeorm";

export {
  SLOT_WINDOWS,
  WORK_ORDER_PRIORITIES,
  WORK_ORDER_STATUSES,
  WORK_ORDER_TYPES,
} from "../../../src/lib/schemas/work-orders.js";
export type { SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "../../../src/lib/schemas/work-orders.js";
import type { SlotWindow, WorkOrderPriority, WorkOrderStatus, WorkOrderType } from "../../../src/lib/schemas/work-orders.js";

/** One piece of work to fix a case: what, where, how soon, who, when, and what was done. */
@Entity({ name: "work_orders" })
@Index("idx_work_orders_case", ["caseId"])
@Index("idx_work_orders_org_status", ["organisationId", "status", "slotDate"])
@Index("idx_work_orders_org_assignee", ["organisationId", "assigneeUserId", "slotDate"])
// The list's default order (target date), for the export's keyset pages.
@Index("idx_work_orders_org_target", ["organisationId", "targetDate", "id"])
export class WorkOrder {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ type: "varchar", length: 30 })
  type: WorkOrderType;

  @Column({ type: "text" })
  description: string;

  @Column({ name: "room_ids", type: "simple-json" })
  roomIds: number[];

  @Column({ type: "varchar", length: 10 })
  priority: WorkOrderPriority;

  /** The date the work should be done by (a London calendar date), defaulting from the case's deadlines. */
  @Column({ name: "target_date", type: "date" })
  targetDate: string;

  @Column({ type: "varchar", length: 20, default: "unscheduled" })
  status: WorkOrderStatus;

  /** The operative (a maintenance-role user) booked to do it; null when unassigned or given to a contractor. */
  @Column({ name: "assignee_user_id", type: "int", unsigned: true, nullable: true })
  assigneeUserId: number | null;

  @Column({ name: "contractor_id", type: "int", unsigned: true, nullable: true })
  contractorId: number | null;

  /** The current appointment, mirrored from its active booking; null while unscheduled. */
  @Column({ name: "slot_date", type: "date", nullable: true })
  slotDate: string | null;

  @Column({ name: "slot_window", type: "varchar", length: 10, nullable: true })
  slotWindow: SlotWindow | null;

  /** How many times it has been (re)scheduled: the calendar invitation's SEQUENCE. */
  @Column({ name: "schedule_count", type: "int", unsigned: true, default: 0 })
  scheduleCount: number;

  /** When the work was done (from the London date the lead entered); the completion event says when it was recorded. */
  @Column({ name: "completed_at", type: "datetime", precision: 3, nullable: true })
  completedAt: Date | null;

  /** The London calendar date the work was actually done, as entered. */
  @Column({ name: "done_on", type: "date", nullable: true })
  doneOn: string | null;

  /** Why the work was done before the booked day (confirmed by the lead); null when it was not early. */
  @Column({ name: "early_reason", type: "text", nullable: true })
  earlyReason: string | null;

  @Column({ name: "completed_by_id", type: "int", unsigned: true, nullable: true })
  completedById: number | null;

  @Column({ name: "completion_note", type: "text", nullable: true })
  completionNote: string | null;

  @Column({ type: "text", nullable: true })
  materials: string | null;

  @Column({ name: "minutes_on_site", type: "int", unsigned: true, nullable: true })
  minutesOnSite: number | null;

  @Column({ name: "follow_on", type: "text", nullable: true })
  followOn: string | null;

  @Column({ name: "created_by_id", type: "int", unsigned: true })
  createdById: number;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @UpdateDateColumn({
    name: "updated_at",
    type: "datetime",
    precision: 3,
    default: () => "CURRENT_TIMESTAMP(3)",
    onUpdate: "CURRENT_TIMESTAMP(3)",
  })
  updatedAt: Date;
}
