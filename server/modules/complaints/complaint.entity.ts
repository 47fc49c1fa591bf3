import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { ComplaintStatus } from "../../../src/lib/contracts/complaints.js";

/**
 * A formal complaint about a case, owned by the complaints module. Its status moves only by a
 * conditional UPDATE on (id, version, status) in ComplaintService, so a stale move changes nothing.
 */
@Entity({ name: "complaints" })
@Index("idx_complaints_case", ["caseId", "id"])
@Index("idx_complaints_org_raised", ["organisationId", "raisedAt"])
export class Complaint {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  /** The case's id while the complaint is open, null once closed: unique, so one open complaint per case. */
  @Index("uq_complaints_open_case", { unique: true })
  @Column({ name: "open_case_id", type: "int", unsigned: true, nullable: true })
  openCaseId: number | null;

  @Column({ type: "varchar", length: 24 })
  status: ComplaintStatus;

  /** Grows by one with every change; a move names the version it saw. */
  @Column({ type: "int", unsigned: true, default: 1 })
  version: number;

  @Column({ name: "raised_by_user_id", type: "int", unsigned: true })
  raisedByUserId: number;

  /** Raised by staff for the tenant (by phone, by letter, in person). */
  @Column({ name: "on_behalf", type: "boolean", default: false })
  onBehalf: boolean;

  /** The complaint in the tenant's words. */
  @Column({ type: "text" })
  description: string;

  @Column({ name: "raised_at", type: "datetime", precision: 3 })
  raisedAt: Date;

  @Column({ name: "stage1_acknowledged_at", type: "datetime", precision: 3, nullable: true })
  stage1AcknowledgedAt: Date | null;

  @Column({ name: "stage1_extension_days", type: "smallint", unsigned: true, nullable: true })
  stage1ExtensionDays: number | null;

  /** Told to the tenant. */
  @Column({ name: "stage1_extension_reason", type: "text", nullable: true })
  stage1ExtensionReason: string | null;

  @Column({ name: "stage1_responded_at", type: "datetime", precision: 3, nullable: true })
  stage1RespondedAt: Date | null;

  @Column({ name: "stage1_response", type: "text", nullable: true })
  stage1Response: string | null;

  @Column({ name: "escalated_at", type: "datetime", precision: 3, nullable: true })
  escalatedAt: Date | null;

  /** Why the tenant is still unhappy, in their words (or staff's for them). */
  @Column({ name: "escalation_reason", type: "text", nullable: true })
  escalationReason: string | null;

  @Column({ name: "stage2_acknowledged_at", type: "datetime", precision: 3, nullable: true })
  stage2AcknowledgedAt: Date | null;

  @Column({ name: "stage2_extension_days", type: "smallint", unsigned: true, nullable: true })
  stage2ExtensionDays: number | null;

  @Column({ name: "stage2_extension_reason", type: "text", nullable: true })
  stage2ExtensionReason: string | null;

  @Column({ name: "stage2_responded_at", type: "datetime", precision: 3, nullable: true })
  stage2RespondedAt: Date | null;

  @Column({ name: "stage2_response", type: "text", nullable: true })
  stage2Response: string | null;

  @Column({ name: "closed_at", type: "datetime", precision: 3, nullable: true })
  closedAt: Date | null;

  @Column({ type: "boolean", default: false })
  apology: boolean;

  @Column({ name: "apology_text", type: "text", nullable: true })
  apologyText: string | null;

  /** What will be put right. */
  @Column({ name: "put_right", type: "text", nullable: true })
  putRight: string | null;

  /** Amounts in pence. */
  @Column({ name: "compensation_offered_pence", type: "int", unsigned: true, nullable: true })
  compensationOfferedPence: number | null;

  @Column({ name: "compensation_offered_on", type: "date", nullable: true })
  compensationOfferedOn: string | null;

  @Column({ name: "compensation_accepted_on", type: "date", nullable: true })
  compensationAcceptedOn: string | null;

  @Column({ name: "compensation_paid_pence", type: "int", unsigned: true, nullable: true })
  compensationPaidPence: number | null;

  @Column({ name: "compensation_paid_on", type: "date", nullable: true })
  compensationPaidOn: string | null;

  /** Staff only: never sent to the tenant. */
  @Column({ name: "staff_note", type: "text", nullable: true })
  staffNote: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
