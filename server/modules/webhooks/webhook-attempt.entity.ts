import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { WebhookDelivery } from "./webhook-delivery.entity.js";

/** One HTTP call of a delivery: when, what the receiver answered (or what went wrong), how long it took. */
@Entity({ name: "webhook_attempts" })
@Index("idx_webhook_attempts_delivery", ["deliveryId", "id"])
export class WebhookAttempt {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "delivery_id", type: "int", unsigned: true })
  deliveryId: number;

  @ManyToOne(() => WebhookDelivery, { onDelete: "CASCADE" })
  @JoinColumn({ name: "delivery_id", foreignKeyConstraintName: "FK_webhook_attempts_delivery" })
  delivery?: WebhookDelivery;

  @Column({ name: "attempted_at", type: "datetime", precision: 3 })
  attemptedAt: Date;

  @Column({ name: "status_code", type: "smallint", unsigned: true, nullable: true })
  statusCode: number | null;

  @Column({ type: "varchar", length: 500, nullable: true })
  error: string | null;

  @Column({ name: "duration_ms", type: "int", unsigned: true })
  durationMs: number;
}
