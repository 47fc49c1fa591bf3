import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * The case's history: every change, who made it, when, and the values before and after.
 * Rows are only ever inserted; a database trigger refuses UPDATE and DELETE.
 */
@Entity({ name: "case_events" })
@Index("idx_case_events_case", ["caseId", "id"])
export class CaseEvent {
  @PrimaryGeneratedColumn({ type: "bigint", unsigned: true })
  id: string;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  /** null for the system (e.g. an e-mail sent automatically). */
  @Column({ name: "actor_user_id", type: "int", unsigned: true, nullable: true })
  actorUserId: number | null;

  /** Written only through CaseService.recordEvent, so one of the kinds in case-events.ts, whose payload `before` and `after` hold. */
  @Column({ type: "varchar", length: 40 })
  type: string;

  @Column({ type: "simple-json", nullable: true })
  before: Record<string, unknown> | null;

  @Column({ type: "simple-json", nullable: true })
  after: Record<string, unknown> | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
