import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export const READING_SOURCES = ["manual", "import"] as const;
export type ReadingSource = (typeof READING_SOURCES)[number];

/** One temperature/humidity reading in a room of a case's home. Unique per (case, room, time). */
@Entity({ name: "readings" })
@Index("uq_readings_case_room_time", ["caseId", "roomId", "takenAt"], { unique: true })
// A case's readings across all rooms in time order (list, export pages).
@Index("idx_readings_case_time_room", ["caseId", "takenAt", "roomId", "id"])
export class Reading {
  @PrimaryGeneratedColumn({ type: "bigint", unsigned: true })
  id: string;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  /** UTC. */
  @Column({ name: "taken_at", type: "datetime", precision: 0 })
  takenAt: Date;

  @Column({
    name: "air_temperature_c",
    type: "decimal",
    precision: 5,
    scale: 2,
    transformer: { to: (v: number) => v, from: (v: string) => Number(v) },
  })
  airTemperatureC: number;

  @Column({
    name: "relative_humidity_pct",
    type: "decimal",
    precision: 5,
    scale: 2,
    transformer: { to: (v: number) => v, from: (v: string) => Number(v) },
  })
  relativeHumidityPct: number;

  @Column({
    name: "surface_temperature_c",
    type: "decimal",
    precision: 5,
    scale: 2,
    nullable: true,
    transformer: { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) },
  })
  surfaceTemperatureC: number | null;

  @Column({
    name: "outdoor_temperature_c",
    type: "decimal",
    precision: 5,
    scale: 2,
    nullable: true,
    transformer: { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) },
  })
  outdoorTemperatureC: number | null;

  @Column({ type: "varchar", length: 10 })
  source: ReadingSource;

  @Column({ name: "import_id", type: "int", unsigned: true, nullable: true })
  importId: number | null;
}
