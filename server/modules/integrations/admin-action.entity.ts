import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { AdminActionKind } from "../../../src/lib/contracts/integrations.js";

/**
 * One change an admin made to the landlord's integrations (an API key created or revoked, a webhook
 * endpoint added, changed, removed or given a new secret): who, what, when. Written in the change's own
 * transaction; never updated. Never holds a secret.
 */
@Entity({ name: "integration_admin_actions" })
@Index("idx_integration_admin_actions_organisation", ["organisationId", "id"])
export class AdminActionEntry {
  @PrimaryGeneratedColumn({ type: "bigint", unsigned: true })
  id: string;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "actor_user_id", type: "int", unsigned: true })
  actorUserId: number;

  @Column({ type: "varchar", length: 40 })
  action: AdminActionKind;

  /** The key's or the endpoint's id (it may since have been removed). */
  @Column({ name: "subject_id", type: "int", unsigned: true })
  subjectId: number;

  /** What it was at the time, for the admin to read: the key's name and scopes, the endpoint's address, the fields changed. */
  @Column({ type: "varchar", length: 500 })
  detail: string;

  /** From the app's clock. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;
}
