import { Column, Entity, Index, PrimaryGeneratedColumn, VersionColumn } from "typeorm";
import type { SensorAlertRule } from "../../../src/lib/domain/sensor-alerts.js";

export const SENSOR_ALERT_STATES = ["open", "acknowledged", "resolved"] as const;
export type SensorAlertState = (typeof SENSOR_ALERT_STATES)[number];

/**
 * A rule that held for a room, raised at the whole hour it first held (from the readings' times).
 * One row per room, rule and hour: worked out again from the same readings, it is the same row.
 * `case_id` is the case it was linked to: the proactive case opened from it, or the home's open case.
 */
@Entity({ name: "sensor_alerts" })
@Index("uq_sensor_alerts_room_rule_hour", ["roomId", "rule", "raisedAt"], { unique: true })
@Index("idx_sensor_alerts_org_state", ["organisationId", "state", "raisedAt"])
@Index("idx_sensor_alerts_property", ["propertyId"])
@Index("idx_sensor_alerts_case", ["caseId"])
export class SensorAlert {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  @Column({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  @Column({ name: "sensor_id", type: "int", unsigned: true })
  sensorId: number;

  @Column({ type: "varchar", length: 20 })
  rule: SensorAlertRule;

  @Column({ name: "raised_at", type: "datetime", precision: 0 })
  raisedAt: Date;

  /** The figures at that hour: { hoursAt80, hoursCondensing, condensingDays, mouldIndex } and the surface basis. */
  // JSON in a longtext (MariaDB's json type is a longtext to TypeORM, which would see drift on every generate).
  @Column({
    type: "longtext",
    transformer: { to: (v: unknown) => JSON.stringify(v), from: (v: string) => JSON.parse(v) as unknown },
  })
  figures: { hoursAt80: number; hoursCondensing: number; condensingDays: number; mouldIndex: number; basis: string };

  @Column({ type: "varchar", length: 14, default: "open" })
  state: SensorAlertState;

  @Column({ name: "case_id", type: "int", unsigned: true, nullable: true })
  caseId: number | null;

  @Column({ name: "dismissed_reason", type: "varchar", length: 500, nullable: true })
  dismissedReason: string | null;

  @Column({ name: "closed_by_id", type: "int", unsigned: true, nullable: true })
  closedById: number | null;

  @Column({ name: "closed_at", type: "datetime", precision: 3, nullable: true })
  closedAt: Date | null;

  /** The app clock when it was stored (the end of the reading-to-alert latency). */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;

  @VersionColumn({ default: 1 })
  version: number;
}
