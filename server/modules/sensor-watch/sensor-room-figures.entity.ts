import { Column, Entity, Index, PrimaryColumn } from "typeorm";

/**
 * A room's live figures from its sensors, worked out again from `sensor_readings` whenever new
 * readings arrive (or the sweep finds the room behind), so nothing here is ever the only copy.
 */
@Entity({ name: "sensor_room_figures" })
@Index("idx_sensor_room_figures_property", ["propertyId"])
export class SensorRoomFigures {
  @PrimaryColumn({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  /** The sensor whose figures these are (the room's worst, when it has several). */
  @Column({ name: "sensor_id", type: "int", unsigned: true })
  sensorId: number;

  /** measured | estimated | air (see SurfaceBasis). */
  @Column({ name: "surface_basis", type: "varchar", length: 10 })
  surfaceBasis: string;

  @Column({ name: "hours_at_80_7d", type: "double" })
  hoursAt80: number;

  @Column({ name: "hours_condensing_7d", type: "double" })
  hoursCondensing: number;

  @Column({ name: "condensing_days_7d", type: "tinyint", unsigned: true })
  condensingDays: number;

  @Column({ name: "mould_index", type: "double" })
  mouldIndex: number;

  /** The last 7 London days: [{ date, hoursAt80, hoursCondensing }]. */
  // JSON in a longtext (MariaDB's json type is a longtext to TypeORM, which would see drift on every generate).
  @Column({
    type: "longtext",
    transformer: { to: (v: unknown) => JSON.stringify(v), from: (v: string) => JSON.parse(v) as unknown },
  })
  days: { date: string; hoursAt80: number; hoursCondensing: number }[];

  @Column({ name: "latest_reading_at", type: "datetime", precision: 0 })
  latestReadingAt: Date;

  @Column({ name: "latest_air_temperature_c", type: "double" })
  latestAirTemperatureC: number;

  @Column({ name: "latest_relative_humidity_pct", type: "double" })
  latestRelativeHumidityPct: number;

  @Column({ name: "latest_surface_rh_pct", type: "double" })
  latestSurfaceRelativeHumidityPct: number;

  /** The app clock when these were worked out. */
  @Column({ name: "computed_at", type: "datetime", precision: 3 })
  computedAt: Date;
}
