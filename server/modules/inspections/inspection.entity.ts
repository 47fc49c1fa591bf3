import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export const CAUSES = [
  "condensation",
  "penetrating-damp",
  "rising-damp",
  "plumbing-leak",
  "roof-gutter",
  "other-unknown",
] as const;
export type Cause = (typeof CAUSES)[number];
export const MOULD_EXTENTS = ["none", "under-1-m2", "1-to-5-m2", "over-5-m2"] as const;
export type MouldExtent = (typeof MOULD_EXTENTS)[number];

export interface InspectionRoomReading {
  roomId: number;
  airTemperatureC?: number;
  relativeHumidityPct?: number;
  surfaceTemperaturesC?: number[];
  /** Moisture meter reading, as % or wood-moisture-equivalent (WME). */
  moisture?: { value: number; unit: "pct" | "wme" };
  note?: string;
}

/** What the surveyor found on site. Recording the first one ends the investigation stage. */
@Entity({ name: "inspections" })
@Index("idx_inspections_case", ["caseId", "inspectedAt"])
export class Inspection {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ name: "inspected_at", type: "datetime", precision: 3 })
  inspectedAt: Date;

  @Column({ name: "inspector_user_id", type: "int", unsigned: true })
  inspectorUserId: number;

  @Column({ type: "varchar", length: 30 })
  cause: Cause;

  @Column({ name: "mould_extent", type: "varchar", length: 20 })
  mouldExtent: MouldExtent;

  @Column({ type: "text" })
  findings: string;

  @Column({ name: "room_readings", type: "simple-json" })
  roomReadings: InspectionRoomReading[];

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
