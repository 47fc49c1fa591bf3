import { Column, Entity, PrimaryColumn } from "typeorm";

const decimal = { to: (v: number) => v, from: (v: string) => Number(v) };
const nullableDecimal = {
  to: (v: number | null) => v,
  from: (v: string | null) => (v === null ? null : Number(v)),
};

/**
 * One reading a sensor sent. The key (sensor, time) makes a re-delivered reading a no-op, and keeps
 * a sensor's readings together in time order on disk.
 */
@Entity({ name: "sensor_readings" })
export class SensorReading {
  @PrimaryColumn({ name: "sensor_id", type: "int", unsigned: true })
  sensorId: number;

  /** UTC, whole seconds. */
  @PrimaryColumn({ name: "taken_at", type: "datetime", precision: 0 })
  takenAt: Date;

  @Column({ name: "air_temperature_c", type: "decimal", precision: 5, scale: 2, transformer: decimal })
  airTemperatureC: number;

  /** Relative to liquid water at every temperature (the WMO convention), as sensors report it. */
  @Column({ name: "relative_humidity_pct", type: "decimal", precision: 5, scale: 2, transformer: decimal })
  relativeHumidityPct: number;

  @Column({
    name: "surface_temperature_c",
    type: "decimal",
    precision: 5,
    scale: 2,
    nullable: true,
    transformer: nullableDecimal,
  })
  surfaceTemperatureC: number | null;

  @Column({ name: "battery_pct", type: "tinyint", unsigned: true, nullable: true })
  batteryPct: number | null;

  /** When the app stored it (its clock): the start of the reading-to-alert latency. */
  @Column({ name: "received_at", type: "datetime", precision: 3 })
  receivedAt: Date;
}
