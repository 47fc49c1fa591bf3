import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from "typeorm";
import type { WebhookEventType } from "../../../src/lib/contracts/webhooks.js";

/**
 * An HTTPS address of a landlord's own system, told about the case events it chose. The signing
 * secret is kept as it is (HMAC needs it to sign), is shown to the admin only when made, and never
 * leaves the server otherwise; after a rotation the previous one also signs until it runs out.
 */
@Entity({ name: "webhook_endpoints" })
@Index("idx_webhook_endpoints_org", ["organisationId", "id"])
export class WebhookEndpoint {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ type: "varchar", length: 2000 })
  url: string;

  @Column({ type: "varchar", length: 200, default: "" })
  description: string;

  @Column({ name: "event_types", type: "simple-json" })
  eventTypes: WebhookEventType[];

  @Column({ type: "varchar", length: 100 })
  secret: string;

  @Column({ name: "previous_secret", type: "varchar", length: 100, nullable: true })
  previousSecret: string | null;

  @Column({ name: "previous_secret_until", type: "datetime", precision: 3, nullable: true })
  previousSecretUntil: Date | null;

  @Column({ name: "secret_rotated_at", type: "datetime", precision: 3, nullable: true })
  secretRotatedAt: Date | null;

  /** Switched off: new events are not queued for it, and its waiting deliveries are given up when due. */
  @Column({ type: "boolean", default: true })
  active: boolean;

  @Column({ name: "created_by_user_id", type: "int", unsigned: true, nullable: true })
  createdByUserId: number | null;

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
