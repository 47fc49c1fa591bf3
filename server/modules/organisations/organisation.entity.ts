import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from "typeorm";

/** A landlord: housing association, council or letting agent. Every staff record belongs to one. */
@Entity({ name: "organisations" })
export class Organisation {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ type: "varchar", length: 190 })
  name: string;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
