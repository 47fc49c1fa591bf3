import { Column, Entity, PrimaryColumn, UpdateDateColumn } from "typeorm";

/** A landlord's complaint timeframes and escalation route. Without a row, the TRADE.md §5 default applies. */
@Entity({ name: "complaint_policies" })
export class ComplaintPolicyRecord {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "stage1_acknowledge_working_days", type: "smallint", unsigned: true })
  stage1AcknowledgeWorkingDays: number;

  @Column({ name: "stage1_respond_working_days", type: "smallint", unsigned: true })
  stage1RespondWorkingDays: number;

  @Column({ name: "stage2_acknowledge_working_days", type: "smallint", unsigned: true })
  stage2AcknowledgeWorkingDays: number;

  @Column({ name: "stage2_respond_working_days", type: "smallint", unsigned: true })
  stage2RespondWorkingDays: number;

  @Column({ name: "extension_max_working_days", type: "smallint", unsigned: true })
  extensionMaxWorkingDays: number;

  /** How the resident takes the complaint further, told in the final response; null for our default wording. */
  @Column({ name: "escalation_route", type: "text", nullable: true })
  escalationRoute: string | null;

  @Column({ name: "updated_by_id", type: "int", unsigned: true })
  updatedById: number;

  @UpdateDateColumn({
    name: "updated_at",
    type: "datetime",
    precision: 3,
    default: () => "CURRENT_TIMESTAMP(3)",
    onUpdate: "CURRENT_TIMESTAMP(3)",
  })
  updatedAt: Date;
}

/** A landlord's own wording of one complaint letter; a kind without a row uses our default. */
@Entity({ name: "complaint_letter_templates" })
export class ComplaintLetterTemplateRecord {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** One of COMPLAINT_LETTER_KINDS (src/lib/domain/complaint-letters.ts). */
  @PrimaryColumn({ type: "varchar", length: 24 })
  kind: string;

  @Column({ type: "varchar", length: 200 })
  subject: string;

  @Column({ type: "text" })
  body: string;

  @Column({ name: "updated_by_id", type: "int", unsigned: true })
  updatedById: number;

  @UpdateDateColumn({
    name: "updated_at",
    type: "datetime",
    precision: 3,
    default: () => "CURRENT_TIMESTAMP(3)",
    onUpdate: "CURRENT_TIMESTAMP(3)",
  })
  updatedAt: Date;
}
