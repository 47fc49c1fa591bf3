import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** One asset register imported by an admin: its counts and the report of every row's outcome. */
@Entity({ name: "stock_imports" })
@Index("idx_stock_imports_org", ["organisationId", "createdAt"])
export class StockImport {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "uploaded_by_id", type: "int", unsigned: true })
  uploadedById: number;

  /** The name the browser gave, for display only; never used as a path. */
  @Column({ name: "file_name", type: "varchar", length: 255 })
  fileName: string;

  @Column({ type: "int", unsigned: true })
  created: number;

  @Column({ type: "int", unsigned: true })
  updated: number;

  @Column({ type: "int", unsigned: true })
  unchanged: number;

  @Column({ type: "int", unsigned: true })
  refused: number;

  /** CSV of every row's outcome: line, UPRN, outcome, the fields changed, the reasons or notes. */
  @Column({ type: "mediumtext" })
  report: string;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
