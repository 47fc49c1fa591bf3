import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** One write made with an API key (any answer, refusals included): which key, which route, the status, when. Never updated. */
@Entity({ name: "api_key_audit_entries" })
@Index("idx_api_key_audit_organisation", ["organisationId", "id"])
@Index("idx_api_key_audit_key", ["apiKeyId", "id"])
export class ApiKeyAuditEntry {
  @PrimaryGeneratedColumn({ type: "bigint", unsigned: true })
  id: string;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "api_key_id", type: "int", unsigned: true })
  apiKeyId: number;

  @Column({ type: "varchar", length: 10 })
  method: string;

  /** The path called, without its query string. */
  @Column({ type: "varchar", length: 300 })
  path: string;

  @Column({ type: "smallint", unsigned: true })
  status: number;

  /** From the app's clock. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;
}
