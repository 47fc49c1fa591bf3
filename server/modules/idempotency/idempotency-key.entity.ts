import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * One `Idempotency-Key` a caller sent with a POST that wrote something: inserted in the same
 * transaction as the write (so both commit or neither does), then given the answer once it is known.
 * Written and read only by IdempotencyService; rows older than a day are purged.
 */
@Entity({ name: "idempotency_keys" })
@Index("uq_idempotency_keys_scope_key", ["scopeKind", "scopeId", "key"], { unique: true })
@Index("idx_idempotency_keys_created", ["createdAt"])
export class IdempotencyKey {
  @PrimaryGeneratedColumn({ type: "bigint", unsigned: true })
  id: string;

  /** Who chose the key: a signed-in user ("user") or an integration API key ("api_key"). */
  @Column({ name: "scope_kind", type: "varchar", length: 16 })
  scopeKind: string;

  @Column({ name: "scope_id", type: "int", unsigned: true })
  scopeId: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** As the caller sent it; compared byte for byte (ascii_bin), so "abc" and "ABC" are two keys. */
  @Column({ name: "idem_key", type: "varchar", length: 100, charset: "ascii", collation: "ascii_bin" })
  key: string;

  @Column({ type: "varchar", length: 8 })
  method: string;

  @Column({ type: "varchar", length: 255 })
  path: string;

  /** SHA-256 (hex) of the method, path, JSON body and uploaded files' bytes. */
  @Column({ name: "request_hash", type: "char", length: 64 })
  requestHash: string;

  /** Null until the first request's answer is stored (or for ever, if it died before that). */
  @Column({ name: "response_status", type: "smallint", unsigned: true, nullable: true })
  responseStatus: number | null;

  /** The JSON answer as sent; null for an answer without a body or one withheld (a secret shown once). */
  @Column({ name: "response_body", type: "longtext", nullable: true })
  responseBody: string | null;

  /** The answer carried a secret (`Cache-Control: no-store`): it is not kept, so it cannot be replayed. */
  @Column({ name: "body_withheld", type: "boolean", default: false })
  bodyWithheld: boolean;

  /** From the app's clock, not a database default. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;

  @Column({ name: "responded_at", type: "datetime", precision: 3, nullable: true })
  respondedAt: Date | null;
}
