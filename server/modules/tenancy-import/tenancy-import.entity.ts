import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { Organisation } from "../organisations/organisation.entity.js";
import { User } from "../users/user.entity.js";

/** One tenancy file brought in by an admin: its counts, its per-row report and its invitation batch. */
@Entity({ name: "tenancy_imports" })
@Index("idx_tenancy_imports_org", ["organisationId", "id"])
export class TenancyImport {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @ManyToOne(() => Organisation, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "organisation_id" })
  organisation?: Organisation;

  @Column({ name: "created_by_id", type: "int", unsigned: true })
  createdById: number;

  @ManyToOne(() => User, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "created_by_id" })
  createdBy?: User;

  @Column({ name: "file_name", type: "varchar", length: 255 })
  fileName: string;

  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;

  @Column({ name: "rows_read", type: "int", unsigned: true })
  rowsRead: number;

  @Column({ name: "created_count", type: "int", unsigned: true })
  createdCount: number;

  @Column({ name: "updated_count", type: "int", unsigned: true })
  updatedCount: number;

  @Column({ name: "unchanged_count", type: "int", unsigned: true })
  unchangedCount: number;

  @Column({ name: "rejected_count", type: "int", unsigned: true })
  rejectedCount: number;

  /** The invitations this import queued (null when it queued none). */
  @Column({ name: "invitation_batch_id", type: "int", unsigned: true, nullable: true })
  invitationBatchId: number | null;

  /**
   * Each row's outcome (a JSON array), for the downloadable report: stored gzip-compressed in base64
   * behind "gzip:" (a 100 000-row report is some 13 MB of JSON), or, for older imports, the plain JSON.
   * Read it through TenancyImportService.report.
   */
  @Column({ type: "longtext" })
  report: string;
}
