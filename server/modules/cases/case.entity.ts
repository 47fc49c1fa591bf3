import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  JoinTable,
  ManyToMany,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from "typeorm";
import type { DeadlineStage, HazardClass } from "../../../src/lib/domain/deadlines.js";
import type { SurfaceState } from "../../../src/lib/domain/surface.js";
import type {
  Area,
  CaseStatus,
  Channel,
  Duration,
  EquipmentAnswer,
  HeatingCostAnswer,
  Location,
  Observation,
  Vulnerability,
} from "../../../src/lib/schemas/case-report.js";
import { Property } from "../properties/property.entity.js";
import { Room } from "../properties/room.entity.js";

export interface Equipment {
  heatingUsable?: EquipmentAnswer;
  extractorFanWorks?: EquipmentAnswer;
  trickleVentsOpen?: EquipmentAnswer;
  heatingCost?: HeatingCostAnswer;
}

/** One report of damp, condensation or mould at a home, from the first moment to closure. */
@Entity({ name: "cases" })
@Index("idx_cases_org_status", ["organisationId", "status"])
@Index("idx_cases_property", ["propertyId", "createdAt"])
@Index("idx_cases_tenant", ["tenantUserId", "createdAt"])
@Index("idx_cases_org_assignee", ["organisationId", "assigneeUserId"])
// Deadlines by date; the queue's "overdue" and "due within" views read this index alone (its filters and sort).
@Index("idx_cases_org_due", ["organisationId", "nextDueAt", "status", "vulnerableHousehold", "priority"])
// The queue's counts of open cases by vulnerability and deadline read this index alone.
@Index("idx_cases_org_status_vulnerable_due", ["organisationId", "status", "vulnerableHousehold", "nextDueAt"])
@Index("idx_cases_triage_due", ["triageDueAt"])
// The queue's text search: the cases of the matching homes, in priority order, without reading their rows.
@Index("idx_cases_org_property_queue", ["organisationId", "propertyId", "priority", "nextDueAt"])
// The dashboard: cases known in a period, and a home's earlier cases (repeats).
@Index("idx_cases_org_aware", ["organisationId", "awareAt"])
@Index("idx_cases_property_aware", ["propertyId", "awareAt"])
// Descending priority then ascending due time: the queue's default order. TypeORM cannot declare a
// descending index, so the migration creates it and TypeORM leaves it alone.
// (organisation_id, priority DESC, next_due_at)
@Index("idx_cases_queue", { synchronize: false })
export class Case {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  /** e.g. DW-2026-00042: the year the landlord became aware and the case id. */
  @Index("uq_cases_reference", { unique: true })
  @Column({ type: "varchar", length: 20, nullable: true })
  reference: string | null;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  @ManyToOne(() => Property, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "property_id" })
  property?: Property;

  @ManyToMany(() => Room)
  @JoinTable({ name: "case_rooms", joinColumn: { name: "case_id" }, inverseJoinColumn: { name: "room_id" } })
  rooms?: Room[];

  /** Who entered the report: the tenant, or the staff member who logged it. */
  @Column({ name: "reporter_user_id", type: "int", unsigned: true })
  reporterUserId: number;

  /** The tenant the case is about, when known; they follow it online. */
  @Column({ name: "tenant_user_id", type: "int", unsigned: true, nullable: true })
  tenantUserId: number | null;

  @Column({ type: "varchar", length: 20 })
  channel: Channel;

  /** When the landlord became aware: legal deadlines run from here (UTC). */
  @Column({ name: "aware_at", type: "datetime", precision: 3 })
  awareAt: Date;

  @Column({ type: "text" })
  description: string;

  @Column({ type: "simple-json" })
  locations: Location[];

  @Column({ type: "simple-json" })
  observations: Observation[];

  @Column({ type: "varchar", length: 20, nullable: true })
  since: Duration | null;

  @Column({ type: "varchar", length: 10, nullable: true })
  area: Area | null;

  /** null: the tenant skipped the question; []: none of these. */
  @Column({ type: "simple-json", nullable: true })
  vulnerability: Vulnerability[] | null;

  /** Denormalised from `vulnerability` for filtering. */
  @Column({ name: "vulnerable_household", type: "boolean", default: false })
  vulnerableHousehold: boolean;

  @Column({ type: "simple-json", nullable: true })
  equipment: Equipment | null;

  @Column({ type: "varchar", length: 20, default: "new" })
  status: CaseStatus;

  /** The staff member working the case; null when unassigned. */
  @Column({ name: "assignee_user_id", type: "int", unsigned: true, nullable: true })
  assigneeUserId: number | null;

  /** The officer's classification of the hazard; null until classified. Deadlines follow it. */
  @Column({ name: "hazard_class", type: "varchar", length: 20, nullable: true })
  hazardClass: HazardClass | null;

  @Column({ name: "hazard_class_reason", type: "text", nullable: true })
  hazardClassReason: string | null;

  /** Set once officers have been told of a risky or vulnerable report, so they are told once. */
  @Column({ name: "officers_alerted_at", type: "datetime", precision: 3, nullable: true })
  officersAlertedAt: Date | null;

  /** When the last of the case's work orders was completed; monitoring runs from here. */
  @Column({ name: "works_done_at", type: "datetime", precision: 3, nullable: true })
  worksDoneAt: Date | null;

  /** The end of the monitoring period after the works (works_done_at + the policy's monitoring days). */
  @Column({ name: "monitoring_ends_at", type: "datetime", precision: 3, nullable: true })
  monitoringEndsAt: Date | null;

  /** Set once the end-of-monitoring reminders have been queued, so they go once. */
  @Column({ name: "monitoring_reminded_at", type: "datetime", precision: 3, nullable: true })
  monitoringRemindedAt: Date | null;

  // Triage figures, kept on the case so the queue can filter and sort thousands of cases quickly.
  // TriageService writes them; every change to a case marks them stale (triageDueAt = now) in the
  // change's own transaction, and they are also due again when the clock moves the deadline factor.

  /** The risk engine's worst surface state over the case's rooms; null while there are no readings. */
  @Column({ name: "risk_state", type: "varchar", length: 12, nullable: true })
  riskState: SurfaceState | null;

  /** The VTT mould index at the latest reading (the highest over the case's rooms), 0–6; null while there are no readings. */
  @Column({
    name: "mould_index",
    type: "decimal",
    precision: 4,
    scale: 2,
    nullable: true,
    transformer: { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) },
  })
  mouldIndex: number | null;

  /** From the latest HHSRS assessment; null until assessed. */
  @Column({ name: "hhsrs_band", type: "char", length: 1, nullable: true })
  hhsrsBand: string | null;

  @Column({ name: "hhsrs_category", type: "tinyint", unsigned: true, nullable: true })
  hhsrsCategory: 1 | 2 | null;

  /** Another case at the same home whose awareness date is within 12 months of this one's. */
  @Column({ type: "boolean", default: false })
  recurrence: boolean;

  /** Triage priority 0–100 (src/lib/domain/triage-priority.ts). */
  @Column({ type: "tinyint", unsigned: true, default: 0 })
  priority: number;

  /** The earliest deadline not yet done; null when none is running. nextDueAt may be past (overdue). */
  @Column({ name: "next_stage", type: "varchar", length: 20, nullable: true })
  nextStage: DeadlineStage | null;

  @Column({ name: "next_due_at", type: "datetime", precision: 3, nullable: true })
  nextDueAt: Date | null;

  /** When the triage figures must be worked out again; null when they hold until the case changes. */
  @Column({ name: "triage_due_at", type: "datetime", precision: 3, nullable: true, default: () => "CURRENT_TIMESTAMP(3)" })
  triageDueAt: Date | null;

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
