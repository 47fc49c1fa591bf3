import { Column, Entity, PrimaryColumn } from "typeorm";

/**
 * The risk engine's result for one room of a case, stored so that reading it does not mean reading
 * every reading again. `readings_version` goes up in the same transaction as any change to the
 * room's readings made through the app; the stored result is current while `computed_version`
 * equals it and `params` (the element and wetness it was worked out for) match the case.
 */
@Entity({ name: "room_evaluations" })
export class RoomEvaluation {
  @PrimaryColumn({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @PrimaryColumn({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  @Column({ name: "readings_version", type: "int", unsigned: true, default: 0 })
  readingsVersion: number;

  @Column({ name: "computed_version", type: "int", unsigned: true, nullable: true })
  computedVersion: number | null;

  @Column({ type: "varchar", length: 100, nullable: true })
  params: string | null;

  /** JSON: the reading count, the latest reading and the series result. */
  @Column({ type: "longtext", nullable: true })
  result: string | null;

  @Column({ name: "computed_at", type: "datetime", precision: 3, nullable: true })
  computedAt: Date | null;
}
