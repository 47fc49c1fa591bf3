import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { Property } from "../properties/property.entity.js";
import { User } from "../users/user.entity.js";

/** A tenant user living at a property between two dates (end open while the tenancy runs). */
@Entity({ name: "tenancies" })
@Index("idx_tenancies_tenant", ["tenantUserId", "endDate"])
@Index("idx_tenancies_property", ["propertyId", "endDate"])
@Index("uq_tenancies_org_reference", ["organisationId", "reference"], { unique: true })
export class Tenancy {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  @ManyToOne(() => Property, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "property_id" })
  property?: Property;

  @Column({ name: "tenant_user_id", type: "int", unsigned: true })
  tenantUserId: number;

  @ManyToOne(() => User, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "tenant_user_id" })
  tenant?: User;

  /** Calendar dates (YYYY-MM-DD), inclusive. */
  @Column({ name: "start_date", type: "date" })
  startDate: string;

  @Column({ name: "end_date", type: "date", nullable: true })
  endDate: string | null;

  @Column({ name: "household_notes", type: "text", nullable: true })
  householdNotes: string | null;

  /**
   * The landlord's own tenancy reference (from its housing management system), unique per landlord;
   * `organisation_id` is set with it (tenancies started by an invitation have neither).
   */
  @Column({ name: "organisation_id", type: "int", unsigned: true, nullable: true })
  organisationId: number | null;

  @Column({ type: "varchar", length: 64, nullable: true })
  reference: string | null;

  /** Kept only where the landlord holds the household's consent (the import checks it). Staff only. */
  @Column({ name: "access_needs", type: "text", nullable: true })
  accessNeeds: string | null;

  @Column({ name: "household_vulnerability", type: "text", nullable: true })
  householdVulnerability: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
