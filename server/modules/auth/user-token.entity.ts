import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { User } from "../users/user.entity.js";

export const TOKEN_PURPOSES = ["invitation", "password-reset", "sign-in-unlock"] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

/** A single-use, expiring link token. Only its SHA-256 is stored; the token itself is only ever in the e-mail. */
@Entity({ name: "user_tokens" })
@Index("idx_user_tokens_user", ["userId", "purpose"])
export class UserToken {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  @ManyToOne(() => User, { onDelete: "CASCADE" })
  @JoinColumn({ name: "user_id" })
  user?: User;

  @Column({ type: "varchar", length: 20 })
  purpose: TokenPurpose;

  @Index("uq_user_tokens_hash", { unique: true })
  @Column({ name: "token_hash", type: "char", length: 64 })
  tokenHash: string;

  @Column({ name: "expires_at", type: "datetime", precision: 3 })
  expiresAt: Date;

  @Column({ name: "used_at", type: "datetime", precision: 3, nullable: true })
  usedAt: Date | null;

  @Column({ name: "created_by_id", type: "int", unsigned: true, nullable: true })
  createdById: number | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
