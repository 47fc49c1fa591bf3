import { Column, Entity, PrimaryColumn } from "typeorm";
import type { DeadlineStage } from "../../../src/lib/domain/deadlines.js";

/** Why a case's deadline stage was missed, in staff's words (the board report lists it); the latest word stands. */
@Entity({ name: "missed_deadline_reasons" })
export class MissedDeadlineReason {
  @PrimaryColumn({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @PrimaryColumn({ type: "varchar", length: 20 })
  stage: DeadlineStage;

  @Column({ type: "text" })
  reason: string;

  @Column({ name: "recorded_by_id", type: "int", unsigned: true })
  recordedById: number;

  @Column({ name: "recorded_at", type: "datetime", precision: 3 })
  recordedAt: Date;
}
