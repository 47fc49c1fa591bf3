import { Column, Entity, Index, PrimaryColumn } from "typeorm";

/** The deadline stages (DEADLINE_STAGES) that apply to a case, and the works completed (no deadline). */
export const CASE_MILESTONES = [
  "make-safe",
  "investigate",
  "summary",
  "safety-work",
  "supplementary-work",
  "works-completed",
] as const;
export type CaseMilestoneName = (typeof CASE_MILESTONES)[number];

/**
 * The dashboard's stored projection of a case's clocks (read by the insight module's SQL aggregates).
 * Written only by CaseService.storeTriageFigures, in the transaction that stores next_stage/next_due_at,
 * from the same computeDeadlines result; a stage that does not apply has no row. The state (met, missed,
 * open) is not stored: it changes with the clock alone and is worked out from due_at, done_at and now.
 */
@Entity({ name: "case_milestones" })
@Index("idx_case_milestones_org_milestone", ["organisationId", "milestone", "dueAt"])
export class CaseMilestone {
  @PrimaryColumn({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @PrimaryColumn({ type: "varchar", length: 20 })
  milestone: CaseMilestoneName;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** null: no statutory due time (not yet running, or not-significant's investigation, or the works completed). */
  @Column({ name: "due_at", type: "datetime", precision: 3, nullable: true })
  dueAt: Date | null;

  @Column({ name: "done_at", type: "datetime", precision: 3, nullable: true })
  doneAt: Date | null;

  /** Working days (working-days.ts) from the case's awareness to done_at; null while not done. */
  @Column({ name: "working_days", type: "smallint", nullable: true })
  workingDays: number | null;
}
