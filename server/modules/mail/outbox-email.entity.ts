import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * pending: waiting for the relay (first try, or a retry at `nextAttemptAt`); sending: claimed by a
 * relay until `leaseExpiresAt`; sent: the mail server accepted it; failed: the relay gave up after
 * its last attempt (staff can resend it).
 */
export const OUTBOX_STATUSES = ["pending", "sending", "sent", "failed"] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

export interface StoredAttachment {
  filename: string;
  content: string;
  contentType: string;
  encoding?: "base64";
}

/** Every e-mail the app sends, stored whole with the change it is about, and how its sending stands; case timelines show these. */
@Entity({ name: "outbox_emails" })
@Index("idx_outbox_related", ["relatedType", "relatedId"])
@Index("idx_outbox_org_created", ["organisationId", "createdAt"])
@Index("idx_outbox_org_status", ["organisationId", "status", "id"])
@Index("idx_outbox_due", ["status", "nextAttemptAt"])
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

  /** The rendered message. Null for rows from before the outbox kept it, and once sent for e-mails carrying a single-use link. */
  @Column({ name: "text_body", type: "mediumtext", nullable: true })
  textBody: string | null;

  @Column({ name: "html_body", type: "mediumtext", nullable: true })
  htmlBody: string | null;

  // JSON in a longtext (MariaDB's json type is a longtext to TypeORM, which would see drift on every generate).
  @Column({
    type: "longtext",
    nullable: true,
    transformer: {
      to: (v: StoredAttachment[] | null | undefined) => (v == null ? v : JSON.stringify(v)),
      from: (v: string | null) => (v == null ? null : (JSON.parse(v) as StoredAttachment[])),
    },
  })
  attachments: StoredAttachment[] | null;

  /** What the e-mail is about, e.g. ("user", 12) or ("case", 40). */
  @Column({ name: "related_type", type: "varchar", length: 40, nullable: true })
  relatedType: string | null;

  @Column({ name: "related_id", type: "int", unsigned: true, nullable: true })
  relatedId: number | null;

  @Column({ type: "varchar", length: 10, default: "pending" })
  status: OutboxStatus;

  /** The last attempt's error (cleared once sent). */
  @Column({ type: "text", nullable: true })
  error: string | null;

  /** Attempts since it was queued (or last resent by staff). */
  @Column({ type: "smallint", unsigned: true, default: 0 })
  attempts: number;

  /** When a pending row is due; null for rows from before the relay (never due). */
  @Column({ name: "next_attempt_at", type: "datetime", precision: 3, nullable: true })
  nextAttemptAt: Date | null;

  /** The claim of the relay sending it, and when that claim runs out (then another relay may take it). */
  @Column({ name: "lease_token", type: "varchar", length: 64, nullable: true })
  leaseToken: string | null;

  @Column({ name: "lease_expires_at", type: "datetime", precision: 3, nullable: true })
  leaseExpiresAt: Date | null;

  /** The Message-ID header, fixed when queued: the delivery key every attempt of this row carries. */
  @Column({ name: "message_id", type: "varchar", length: 255, nullable: true })
  messageId: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @Column({ name: "last_attempt_at", type: "datetime", precision: 3, nullable: true })
  lastAttemptAt: Date | null;

  @Column({ name: "sent_at", type: "datetime", precision: 3, nullable: true })
  sentAt: Date | null;

  /** The staff member who last asked for it to be sent again, and when. */
  @Column({ name: "resent_by_user_id", type: "int", unsigned: true, nullable: true })
  resentByUserId: number | null;

  @Column({ name: "resent_at", type: "datetime", precision: 3, nullable: true })
  resentAt: Date | null;
}
