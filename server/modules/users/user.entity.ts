import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from "typeorm";
import { Organisation } from "../organisations/organisation.entity.js";

export const ROLES = ["tenant", "officer", "maintenance", "admin"] as const;
export type Role = (typeof ROLES)[number];
export const STAFF_ROLES = ["officer", "maintenance", "admin"] as const satisfies readonly Role[];

/**
 * invited: has a pending invitation and no password yet; disabled: may not sign in; cancelled: the
 * invitation was withdrawn before it was accepted (kept, so what refers to the account still can).
 */
export const USER_STATUSES = ["invited", "active", "disabled", "cancelled"] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

@Entity({ name: "users" })
@Index("idx_users_organisation_role", ["organisationId", "role"])
// The accounts list's order (role, name), for the export's keyset pages.
@Index("idx_users_org_role_name", ["organisationId", "role", "name", "id"])
export class User {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @ManyToOne(() => Organisation, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "organisation_id" })
  organisation?: Organisation;

  /** Stored lower-cased and trimmed. */
  @Index("uq_users_email", { unique: true })
  @Column({ type: "varchar", length: 190 })
  email: string;

  @Column({ type: "varchar", length: 190 })
  name: string;

  @Column({ name: "password_hash", type: "varchar", length: 255, nullable: true })
  passwordHash: string | null;

  @Column({ type: "varchar", length: 20 })
  role: Role;

  @Column({ type: "varchar", length: 40, nullable: true })
  phone: string | null;

  /** A BCP 47 language tag ("en", "cy", "pl"), lower-case primary subtag; null when not known. */
  @Column({ name: "preferred_language", type: "varchar", length: 35, nullable: true })
  preferredLanguage: string | null;

  @Column({ type: "varchar", length: 20, default: "active" })
  status: UserStatus;

  /**
   * Stamped into each session at sign-in; raised to end every session of the account (a password
   * reset, a role change, the account disabled). A session with an older stamp is signed out.
   */
  @Column({ name: "session_epoch", type: "int", unsigned: true, default: 0 })
  sessionEpoch: number;

  @Column({ name: "last_sign_in_at", type: "datetime", precision: 3, nullable: true })
  lastSignInAt: Date | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @UpdateDateColumn({
    name: "updated_at",
    type: "datetime",
    precision: 3,
    default: () => "CURRENT_TIMESTAMP(3)",
    onUpdate: "CURRENT_TIMESTAMP(3)",
  })
  updatedAt: Date;
}
