import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import type { WebhookDeliveryStatus } from "../../../src/lib/contracts/webhooks.js";
import { WebhookEndpoint } from "./webhook-endpoint.entity.js";
import { WebhookEvent } from "./webhook-event.entity.js";

/**
 * One event owed to one endpoint: the persistent queue the relay works from (written in the same
 * transaction as the change it is about). Claimed with a lease like the e-mail outbox.
 */
@Entity({ name: "webhook_deliveries" })
@Index("uq_webhook_deliveries_event_endpoint", ["eventId", "endpointId"], { unique: true })
@Index("idx_webhook_deliveries_due", ["status", "nextAttemptAt"])
@Index("idx_webhook_deliveries_endpoint", ["endpointId", "id"])
export class WebhookDelivery {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "event_id", type: "int", unsigned: true })
  eventId: number;

  @ManyToOne(() => WebhookEvent, { onDelete: "CASCADE" })
  @JoinColumn({ name: "event_id", foreignKeyConstraintName: "FK_webhook_deliveries_event" })
  event?: WebhookEvent;

  @Column({ name: "endpoint_id", type: "int", unsigned: true })
  endpointId: number;

  @ManyToOne(() => WebhookEndpoint, { onDelete: "CASCADE" })
  @JoinColumn({ name: "endpoint_id", foreignKeyConstraintName: "FK_webhook_deliveries_endpoint" })
  endpoint?: WebhookEndpoint;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ type: "varchar", length: 10, default: "pending" })
  status: WebhookDeliveryStatus;

  /** Attempts since it was queued (or last sent again by an admin). */
  @Column({ type: "smallint", unsigned: true, default: 0 })
  attempts: number;

  @Column({ name: "next_attempt_at", type: "datetime", precision: 3, nullable: true })
  nextAttemptAt: Date | null;

  @Column({ name: "lease_token", type: "varchar", length: 64, nullable: true })
  leaseToken: string | null;

  @Column({ name: "lease_expires_at", type: "datetime", precision: 3, nullable: true })
  leaseExpiresAt: Date | null;

  @Column({ name: "delivered_at", type: "datetime", precision: 3, nullable: true })
  deliveredAt: Date | null;

  @Column({ name: "resent_by_user_id", type: "int", unsigned: true, nullable: true })
  resentByUserId: number | null;

  @Column({ name: "resent_at", type: "datetime", precision: 3, nullable: true })
  resentAt: Date | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
