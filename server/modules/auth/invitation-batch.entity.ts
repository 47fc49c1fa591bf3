import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { Organisation } from "../organisations/organisation.entity.js";
import { User } from "../users/user.entity.js";

/**
 * A set of invitations queued together (by a tenancy import) and released a few at a time by the
 * background tick, so a landlord's whole tenant list is never e-mailed at once.
 */
@Entity({ name: "invitation_batches" })
@Index("idx_invitation_batches_org", ["organisationId", "id"])
export class InvitationBatch {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @ManyToOne(() => Organisation, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "organisation_id" })
  organisation?: Organisation;

  /** The admin who queued it: the invitations go out in their name. */
  @Column({ name: "created_by_id", type: "int", unsigned: true })
  createdById: number;

  @ManyToOne(() => User, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "created_by_id" })
  createdBy?: User;

  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;

  /** When the tick last released some of it (the next release is one interval later). */
  @Column({ name: "last_released_at", type: "datetime", precision: 3, nullable: true })
  lastReleasedAt: Date | null;

  @Column({ name: "paused_at", type: "datetime", precision: 3, nullable: true })
  pausedAt: Date | null;

  @Column({ name: "cancelled_at", type: "datetime", precision: 3, nullable: true })
  cancelledAt: Date | null;
}

export const PENDING_INVITATION_STATUSES = ["pending", "sent", "skipped", "cancelled"] as const;
export type PendingInvitationStatus = (typeof PENDING_INVITATION_STATUSES)[number];

/**
 * One invitation waiting in a batch. `userId` is null when the address belongs to another landlord's
 * account: that address is sent the "already in use" e-mail instead, and the admin is told nothing
 * different (the same rule as a single invitation).
 */
@Entity({ name: "pending_invitations" })
@Index("idx_pending_invitations_status", ["status", "id"])
@Index("idx_pending_invitations_batch", ["batchId", "status"])
@Index("idx_pending_invitations_org_email", ["organisationId", "email"])
export class PendingInvitation {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "batch_id", type: "int", unsigned: true })
  batchId: number;

  @ManyToOne(() => InvitationBatch, { onDelete: "CASCADE" })
  @JoinColumn({ name: "batch_id" })
  batch?: InvitationBatch;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "user_id", type: "int", unsigned: true, nullable: true })
  userId: number | null;

  @ManyToOne(() => User, { onDelete: "CASCADE" })
  @JoinColumn({ name: "user_id" })
  user?: User;

  /** Stored lower-cased and trimmed. */
  @Column({ type: "varchar", length: 190 })
  email: string;

  @Column({ type: "varchar", length: 20, default: "pending" })
  status: PendingInvitationStatus;

  @Column({ name: "released_at", type: "datetime", precision: 3, nullable: true })
  releasedAt: Date | null;
}
