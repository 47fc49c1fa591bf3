import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * What one photo upload asked the server to decode: bytes received and pixels claimed by the
 * images' headers. Summed per user over the last hour for the upload budget, in the database so the
 * budget holds across instances. Written and pruned only by PhotoService.
 */
@Entity({ name: "photo_upload_usage" })
@Index("idx_photo_upload_usage_user", ["userId", "createdAt"])
export class PhotoUploadUsage {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  @Column({ type: "bigint", unsigned: true, transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  pixels: number;

  @Column({ type: "bigint", unsigned: true, transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  bytes: number;

  /** From the app's clock, not a database default. */
  @Column({ name: "created_at", type: "datetime", precision: 3 })
  createdAt: Date;
}
