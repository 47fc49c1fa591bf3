import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** The written summary of an investigation sent to the tenant; the first one stops the summary clock. */
@Entity({ name: "written_summaries" })
@Index("idx_written_summaries_case", ["caseId", "sentAt"])
export class WrittenSummary {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ name: "sender_user_id", type: "int", unsigned: true })
  senderUserId: number;

  @Column({ type: "text" })
  body: string;

  @Column({ name: "outbox_id", type: "int", unsigned: true, nullable: true })
  outboxId: number | null;

  @Column({ name: "sent_at", type: "datetime", precision: 3 })
  sentAt: Date;
}
