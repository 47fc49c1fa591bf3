import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** An outside firm the landlord sends work to, reached by e-mail. */
@Entity({ name: "contractors" })
@Index("idx_contractors_org", ["organisationId", "name"])
export class Contractor {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ type: "varchar", length: 190 })
  name: string;

  @Column({ type: "varchar", length: 190 })
  email: string;

  @Column({ type: "varchar", length: 40, nullable: true })
  phone: string | null;

  /** What they do, in the landlord's words (e.g. "ventilation", "roofing"). */
  @Column({ type: "varchar", length: 100, nullable: true })
  trade: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
