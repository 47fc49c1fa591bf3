import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * pending: waiting for the relay (first try, or a retry at `nextAttemptAt`); sending: claimed by a relay
 * until `leaseExpiresAt`; sent: the provider accepted it (its id is `providerId`); failed: the relay gave
 * up after its last attempt, or the provider refused it for good (a 400 or 403).
 */
export const SMS_STATUSES = ["pending", "sending", "sent", "failed"] as const;
export type SmsStatus = (typeof SMS_STATUSES)[number];

/** Every text the app sends, stored whole with the change it is about, and how its sending stands. */
@Entity({ name: "outbox_sms" })
@Index("idx_outbox_sms_due", ["status", "nextAttemptAt"])
@Index("idx_outbox_sms_related", ["relatedType", "relatedId"])
@Index("idx_outbox_sms_user", ["userId", "id"])
export class OutboxSms {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** The tenant it is for. */
  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  @Column({ name: "to_number", type: "varchar", length: 16 })
  toNumber: string;

  /** Which text it is (appointment-offered, appointment-reminder, landlord-replied, summary-sent). */
  @Column({ type: "varchar", length: 40 })
  kind: string;

  @Column({ type: "text" })
  body: string;

  /** What the text is about, e.g. ("case", 40). */
  @Column({ name: "related_type", type: "varchar", length: 40, nullable: true })
  relatedType: string | null;

  @Column({ name: "related_id", type: "int", unsigned: true, nullable: true })
  relatedId: number | null;

  /** One text per occasion where it must never go twice (a reminder per booking); null otherwise. */
  @Index("uq_outbox_sms_once", { unique: true })
  @Column({ name: "once_key", type: "varchar", length: 100, nullable: true })
  onceKey: string | null;

  @Column({ type: "varchar", length: 10, default: "pending" })
  status: SmsStatus;

  /** The last attempt's error (cleared once sent). */
  @Column({ type: "text", nullable: true })
  error: string | null;

  @Column({ type: "smallint", unsigned: true, default: 0 })
  attempts: number;

  @Column({ name: "next_attempt_at", type: "datetime", precision: 3, nullable: true })
  nextAttemptAt: Date | null;

  @Column({ name: "lease_token", type: "varchar", length: 64, nullable: true })
  leaseToken: string | null;

  @Column({ name: "lease_expires_at", type: "datetime", precision: 3, nullable: true })
  leaseExpiresAt: Date | null;

  /** The provider's id for the text, once accepted. */
  @Column({ name: "provider_id", type: "varchar", length: 64, nullable: true })
  providerId: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @Column({ name: "last_attempt_at", type: "datetime", precision: 3, nullable: true })
  lastAttemptAt: Date | null;

  @Column({ name: "sent_at", type: "datetime", precision: 3, nullable: true })
  sentAt: Date | null;
}
