import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * One event as sent: `body` is the exact JSON every attempt to every endpoint sends (the bytes that
 * are signed), fixed when the event was recorded. `uid` is the event id receivers de-duplicate by.
 * `dedupeKey` keeps an event that may be noticed many times (a missed deadline) to one row.
 */
@Entity({ name: "webhook_events" })
@Index("uq_webhook_events_uid", ["uid"], { unique: true })
@Index("uq_webhook_events_dedupe", ["dedupeKey"], { unique: true })
@Index("idx_webhook_events_org", ["organisationId", "id"])
export class WebhookEvent {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ type: "char", length: 36 })
  uid: string;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ type: "varchar", length: 40 })
  type: string;

  @Column({ name: "case_id", type: "int", unsigned: true, nullable: true })
  caseId: number | null;

  @Column({ name: "case_reference", type: "varchar", length: 20, nullable: true })
  caseReference: string | null;

  @Column({ name: "dedupe_key", type: "varchar", length: 120, nullable: true })
  dedupeKey: string | null;

  @Column({ type: "mediumtext" })
  body: string;

  @Column({ name: "occurred_at", type: "datetime", precision: 3 })
  occurredAt: Date;
}
