import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";
import type { ApiScope } from "../../../src/lib/contracts/integrations.js";

/**
 * A landlord's key for the integration API (/api/v1). The secret is never stored: only its SHA-256.
 * A revoked key stays (its audit entries name it), refused from the moment it is revoked.
 */
@Entity({ name: "api_keys" })
@Index("idx_api_keys_organisation", ["organisationId", "id"])
export class ApiKey {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ type: "varchar", length: 100 })
  name: string;

  /** Comma-separated scopes (src/lib/contracts/integrations.ts). */
  @Column({
    type: "varchar",
    length: 200,
    transformer: {
      to: (v: readonly ApiScope[]) => v.join(","),
      from: (v: string) => (v ? (v.split(",") as ApiScope[]) : []),
    },
  })
  scopes: ApiScope[];

  /** Hex SHA-256 of the key's random part. */
  @Column({ name: "secret_hash", type: "char", length: 64 })
  secretHash: string;

  /** The admin who made it; the key acts as this person while they remain an active admin. */
  @Column({ name: "created_by_user_id", type: "int", unsigned: true })
  createdByUserId: number;

  /** From the app's clock. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;

  /** Updated at most once a minute, not on every request. */
  @Column({ name: "last_used_at", type: "datetime", precision: 3, nullable: true })
  lastUsedAt: Date | null;

  @Column({ name: "revoked_at", type: "datetime", precision: 3, nullable: true })
  revokedAt: Date | null;

  @Column({ name: "revoked_by_user_id", type: "int", unsigned: true, nullable: true })
  revokedByUserId: number | null;
}
