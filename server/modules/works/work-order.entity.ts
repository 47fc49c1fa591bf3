import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from "typeorm";

export const WORK_ORDER_TYPES = [
  "extractor-fan",
  "fan-upgrade",
  "trickle-vents",
  "door-undercut",
  "piv-unit",
  "mould-wash",
  "mould-resistant-decoration",
  "insulation",
  "draught-proofing",
  "heating",
  "leak-repair",
  "roof-gutter",
  "damp-proofing",
  "other",
] as const;
export type WorkOrderType = (typeof WORK_ORDER_TYPES)[number];

export const WORK_ORDER_PRIORITIES = ["emergency", "urgent", "routine"] as const;
export type WorkOrderPriority = (typeof WORK_ORDER_PRIORITIES)[number];

/**
 * unscheduled → scheduled (an appointment proposed to the tenant) → confirmed by the tenant, or
 * change-requested (the tenant asked for another slot) → scheduled again → done. cancelled at any point before done.
 */
export const WORK_ORDER_STATUSES = ["unscheduled", "scheduled", "confirmed", "change-requested", "done", "cancelled"] as const;
export type WorkOrderStatus = (typeof WORK_ORDER_STATUSES)[number];

export const SLOT_WINDOWS = ["am", "pm", "all-day"] as const;
export type SlotWindow = (typeof SLOT_WINDOWS)[number];

/** One piece of work to fix a case: what, where, how soon, who, when, and what was done. */
@Entity({ name: "work_orders" })
@Index("idx_work_orders_case", ["caseId"])
@Index("idx_work_orders_org_status", ["organisationId", "status", "slotDate"])
@Index("idx_work_orders_org_assignee", ["organisationId", "assigneeUserId", "slotDate"])
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

  @Column({ name: "completed_at", type: "datetime", precision: 3, nullable: true })
  completedAt: Date | null;

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

  @UpdateDateColumn({ name: "updated_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)", onUpdate: "CURRENT_TIMESTAMP(3)" })
  updatedAt: Date;
}
