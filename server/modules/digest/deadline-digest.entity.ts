import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { OutboxEmail } from "../mail/outbox-email.entity.js";
import { User } from "../users/user.entity.js";

/**
 * One officer's deadline digest for one London calendar day. Written in the same transaction as
 * the outbox e-mail, so the unique (user, day) key makes the digest go out at most once a day,
 * whether the sender crashes, runs twice or runs on two servers at once.
 */
@Entity({ name: "deadline_digests" })
@Index("uq_deadline_digests_user_date", ["userId", "digestDate"], { unique: true })
export class DeadlineDigest {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  @ManyToOne(() => User, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "user_id" })
  user?: User;

  /** The London calendar day the digest is for (YYYY-MM-DD). */
  @Column({ name: "digest_date", type: "date" })
  digestDate: string;

  @Column({ name: "outbox_email_id", type: "int", unsigned: true })
  outboxEmailId: number;

  @ManyToOne(() => OutboxEmail, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "outbox_email_id" })
  outboxEmail?: OutboxEmail;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
