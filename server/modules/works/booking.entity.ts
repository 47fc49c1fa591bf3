import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { SlotWindow } from "./work-order.entity.js";

/**
 * Every appointment a work order has had, kept when it is rescheduled (state `replaced`), so the
 * history of who was booked when stays on record.
 */
@Entity({ name: "work_order_bookings" })
@Index("idx_bookings_work_order", ["workOrderId", "id"])
export class WorkOrderBooking {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "work_order_id", type: "int", unsigned: true })
  workOrderId: number;

  @Column({ name: "assignee_user_id", type: "int", unsigned: true, nullable: true })
  assigneeUserId: number | null;

  @Column({ name: "contractor_id", type: "int", unsigned: true, nullable: true })
  contractorId: number | null;

  @Column({ name: "slot_date", type: "date" })
  slotDate: string;

  @Column({ name: "slot_window", type: "varchar", length: 10 })
  slotWindow: SlotWindow;

  /** active: the current appointment; replaced: rescheduled; cancelled: the order was cancelled. */
  @Column({ type: "varchar", length: 10, default: "active" })
  state: "active" | "replaced" | "cancelled";

  /** The tenant's answer: null until they answer; "confirmed", or "change-requested" with a reason. */
  @Column({ name: "tenant_response", type: "varchar", length: 20, nullable: true })
  tenantResponse: "confirmed" | "change-requested" | null;

  @Column({ name: "tenant_reason", type: "text", nullable: true })
  tenantReason: string | null;

  @Column({ name: "responded_at", type: "datetime", precision: 3, nullable: true })
  respondedAt: Date | null;

  @Column({ name: "created_by_id", type: "int", unsigned: true })
  createdById: number;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
