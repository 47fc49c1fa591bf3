import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * How far one person has read a case's conversation: a row each time their "read up to" mark moves
 * forward (to the id of the newest message they were shown), so the time each message was first read
 * stays known for the read receipts. Only ever inserted; the current mark is the highest.
 */
@Entity({ name: "case_read_marks" })
@Index("uq_case_read_marks", ["caseId", "userId", "upToEventId"], { unique: true })
@Index("idx_case_read_marks_user", ["userId", "caseId"])
export class CaseReadMark {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  /** The id of the newest message (its `case_events` row) read at that moment. */
  @Column({ name: "up_to_event_id", type: "bigint", unsigned: true })
  upToEventId: string;

  /** From the app's clock. */
  @Column({ name: "read_at", type: "datetime", precision: 3 })
  readAt: Date;
}
