import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * One HHSRS assessment of hazard 1 (damp and mould growth) for a case. Assessments are versioned:
 * a new judgement is a new row with the next version, and earlier ones are never changed.
 */
@Entity({ name: "hhsrs_assessments" })
@Index("uq_hhsrs_assessments_case_version", ["caseId", "version"], { unique: true })
export class HhsrsAssessmentRecord {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ type: "int", unsigned: true })
  version: number;

  @Column({ name: "assessor_user_id", type: "int", unsigned: true })
  assessorUserId: number;

  /** L in "1 in L", a representative scale point. */
  @Column({ type: "int", unsigned: true })
  likelihood: number;

  /** Spread of harm over classes I–IV, in %. */
  @Column({ type: "simple-json" })
  spread: [number, number, number, number];

  @Column({ type: "text" })
  justification: string;

  /** The exact score as computed (bands are decided on it); display uses two decimals. */
  @Column({ type: "double" })
  score: number;

  @Column({ type: "char", length: 1 })
  band: string;

  @Column({ type: "tinyint", unsigned: true })
  category: 1 | 2;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
