import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** One logger CSV imported into a case, with its counts and the report of rejected rows. */
@Entity({ name: "reading_imports" })
@Index("idx_reading_imports_case", ["caseId"])
export class ReadingImport {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  @Column({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  @Column({ name: "uploaded_by_id", type: "int", unsigned: true })
  uploadedById: number;

  /** The name the browser gave, for display only; never used as a path. */
  @Column({ name: "file_name", type: "varchar", length: 255 })
  fileName: string;

  @Column({ type: "int", unsigned: true })
  imported: number;

  @Column({ type: "int", unsigned: true })
  duplicates: number;

  @Column({ type: "int", unsigned: true })
  rejected: number;

  /** CSV of "row,reason" for every rejected row (capped; see the import service). */
  @Column({ name: "rejected_report", type: "mediumtext", nullable: true })
  rejectedReport: string | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
