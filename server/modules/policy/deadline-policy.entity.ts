import { Column, Entity, PrimaryColumn, UpdateDateColumn } from "typeorm";

/** A landlord's own timeframes. A landlord without a row uses the England social-housing default. */
@Entity({ name: "deadline_policies" })
export class DeadlinePolicyRecord {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "emergency_make_safe_hours", type: "smallint", unsigned: true })
  emergencyMakeSafeHours: number;

  @Column({ name: "investigate_working_days", type: "smallint", unsigned: true })
  investigateWorkingDays: number;

  @Column({ name: "summary_working_days", type: "smallint", unsigned: true })
  summaryWorkingDays: number;

  @Column({ name: "safety_work_working_days", type: "smallint", unsigned: true })
  safetyWorkWorkingDays: number;

  @Column({ name: "supplementary_work_weeks", type: "smallint", unsigned: true })
  supplementaryWorkWeeks: number;

  /** Days of readings after the works before the fix is judged (our default 21: common practice, no source). */
  @Column({ name: "monitoring_days", type: "smallint", unsigned: true, default: 21 })
  monitoringDays: number;

  /** The landlord's emergency telephone line, as the admin wrote it (a UK number); null when not set. */
  @Column({ name: "emergency_phone", type: "varchar", length: 32, nullable: true })
  emergencyPhone: string | null;

  @Column({ name: "updated_by_id", type: "int", unsigned: true })
  updatedById: number;

  @UpdateDateColumn({
    name: "updated_at",
    type: "datetime",
    precision: 3,
    default: () => "CURRENT_TIMESTAMP(3)",
    onUpdate: "CURRENT_TIMESTAMP(3)",
  })
  updatedAt: Date;
}
