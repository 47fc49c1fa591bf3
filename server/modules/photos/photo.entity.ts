import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** A re-encoded photo (display copy and thumbnail) of a case. The uploaded bytes are never kept. */
@Entity({ name: "photos" })
@Index("uq_photos_case_sha", ["caseId", "sha256"], { unique: true })
export class Photo {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "case_id", type: "int", unsigned: true })
  caseId: number;

  /** Set for photos taken as evidence of a work order (after the works); null for the case's own photos. */
  @Column({ name: "work_order_id", type: "int", unsigned: true, nullable: true })
  workOrderId: number | null;

  @Column({ name: "uploaded_by_id", type: "int", unsigned: true })
  uploadedById: number;

  /** Relative to the uploads directory: <organisation>/<case>/<random>.jpg */
  @Column({ name: "display_path", type: "varchar", length: 255 })
  displayPath: string;

  @Column({ name: "thumbnail_path", type: "varchar", length: 255 })
  thumbnailPath: string;

  @Column({ type: "int", unsigned: true })
  width: number;

  @Column({ type: "int", unsigned: true })
  height: number;

  @Column({ type: "int", unsigned: true })
  bytes: number;

  /** SHA-256 of the stored display copy. */
  @Column({ type: "char", length: 64 })
  sha256: string;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
