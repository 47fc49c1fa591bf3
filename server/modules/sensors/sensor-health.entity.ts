import { Column, Entity, Index, PrimaryColumn } from "typeorm";

/**
 * A sensor's last health check from its readings, kept so the lead's summary of thousands of sensors
 * need not read their readings. Offline is not stored: it moves with the clock and is worked out from
 * `sensors.last_reading_at` when asked. Owned by SensorHealthService, written only by its sweep.
 */
@Entity({ name: "sensor_health" })
@Index("idx_sensor_health_evaluated", ["evaluatedAt"])
export class SensorHealthRecord {
  @PrimaryColumn({ name: "sensor_id", type: "int", unsigned: true })
  sensorId: number;

  /** The sensor's newest reading time when it was checked: a newer one means check again. */
  @Column({ name: "readings_through", type: "datetime", precision: 0, nullable: true })
  readingsThrough: Date | null;

  /** The app clock at the check. */
  @Column({ name: "evaluated_at", type: "datetime", precision: 3 })
  evaluatedAt: Date;

  @Column({ name: "low_battery_since", type: "datetime", precision: 0, nullable: true })
  lowBatterySince: Date | null;

  @Column({ name: "low_battery_reason", type: "varchar", length: 300, nullable: true })
  lowBatteryReason: string | null;

  @Column({ name: "flat_since", type: "datetime", precision: 0, nullable: true })
  flatSince: Date | null;

  @Column({ name: "flat_reason", type: "varchar", length: 300, nullable: true })
  flatReason: string | null;

  @Column({ name: "jump_since", type: "datetime", precision: 0, nullable: true })
  jumpSince: Date | null;

  @Column({ name: "jump_reason", type: "varchar", length: 300, nullable: true })
  jumpReason: string | null;
}
