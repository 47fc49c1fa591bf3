import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { UserAuditAction } from "../../../src/lib/contracts/users.js";

/**
 * Who did what to whose account, and when: invitations sent, resent, cancelled and accepted, names
 * and roles changed, accounts disabled and enabled. Written only by UserService.recordAudit, in the
 * transaction of the change it describes; never updated.
 */
@Entity({ name: "user_audit_entries" })
@Index("idx_user_audit_target", ["targetUserId", "id"])
@Index("idx_user_audit_organisation", ["organisationId", "createdAt"])
export class UserAuditEntry {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** The person who made the change (the invited person themself for an accepted invitation). */
  @Column({ name: "actor_user_id", type: "int", unsigned: true })
  actorUserId: number;

  @Column({ name: "target_user_id", type: "int", unsigned: true })
  targetUserId: number;

  @Column({ type: "varchar", length: 40 })
  action: UserAuditAction;

  /** The value before the change (a name, a role or a status), when there was one. */
  @Column({ name: "from_value", type: "varchar", length: 190, nullable: true })
  fromValue: string | null;

  @Column({ name: "to_value", type: "varchar", length: 190, nullable: true })
  toValue: string | null;

  /** From the app's clock, not a database default. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;
}
