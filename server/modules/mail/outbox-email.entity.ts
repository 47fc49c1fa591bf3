import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export const OUTBOX_STATUSES = ["pending", "sent", "failed"] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

/** Every e-mail the app sends, with its outcome; case timelines show these. */
@Entity({ name: "outbox_emails" })
@Index("idx_outbox_related", ["relatedType", "relatedId"])
@Index("idx_outbox_org_created", ["organisationId", "createdAt"])
export class OutboxEmail {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true, nullable: true })
  organisationId: number | null;

  @Column({ name: "to_address", type: "varchar", length: 190 })
  toAddress: string;

  @Column({ type: "varchar", length: 255 })
  subject: string;

  @Column({ type: "varchar", length: 60 })
  template: string;

  /** What the e-mail is about, e.g. ("user", 12) or ("case", 40). */
  @Column({ name: "related_type", type: "varchar", length: 40, nullable: true })
  relatedType: string | null;

  @Column({ name: "related_id", type: "int", unsigned: true, nullable: true })
  relatedId: number | null;

  @Column({ type: "varchar", length: 10, default: "pending" })
  status: OutboxStatus;

  @Column({ type: "text", nullable: true })
  error: string | null;

  @Column({ name: "message_id", type: "varchar", length: 255, nullable: true })
  messageId: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @Column({ name: "sent_at", type: "datetime", precision: 3, nullable: true })
  sentAt: Date | null;
}
