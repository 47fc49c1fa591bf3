import { Column, Entity, PrimaryColumn, UpdateDateColumn } from "typeorm";

/**
 * The landlord's own route for tenants who find heating hard to afford (a fund, an adviser, a referral),
 * shown beside the home's advice. Without a row, tenants see neutral general wording (no organisation named).
 */
@Entity({ name: "heating_support_policies" })
export class HeatingSupportPolicyRecord {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** A short plain-English text in the landlord's own words. */
  @Column({ name: "support_text", type: "varchar", length: 1000 })
  supportText: string;

  /** An optional telephone number to call. */
  @Column({ name: "support_phone", type: "varchar", length: 32, nullable: true })
  supportPhone: string | null;

  /** An optional web address (https). */
  @Column({ name: "support_link", type: "varchar", length: 500, nullable: true })
  supportLink: string | null;

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
