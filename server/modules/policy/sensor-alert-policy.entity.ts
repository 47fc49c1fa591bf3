import { Column, Entity, PrimaryColumn, UpdateDateColumn } from "typeorm";

/** A landlord's sensor alert rules. Without a row, our own defaults apply (DEFAULT_SENSOR_ALERT_SETTINGS). */
@Entity({ name: "sensor_alert_policies" })
export class SensorAlertPolicyRecord {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({
    name: "mould_index_at_least",
    type: "decimal",
    precision: 3,
    scale: 1,
    transformer: { to: (v: number) => v, from: (v: string) => Number(v) },
  })
  mouldIndexAtLeast: number;

  @Column({ name: "hours_at_80_in_7_days", type: "smallint", unsigned: true })
  hoursAt80In7Days: number;

  @Column({ name: "condensing_days_in_7_days", type: "tinyint", unsigned: true })
  condensingDaysIn7Days: number;

  @Column({ name: "cooldown_days", type: "smallint", unsigned: true })
  cooldownDays: number;

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
