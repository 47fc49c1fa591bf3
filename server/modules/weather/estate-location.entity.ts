import { Column, Entity, PrimaryColumn } from "typeorm";

const decimal = { to: (v: number) => v, from: (v: string) => Number(v) };

/** Where a landlord's estate is, for the weather of its homes that have no coordinates of their own. */
@Entity({ name: "estate_locations" })
export class EstateLocation {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** The estate's name exactly as on its homes. */
  @PrimaryColumn({ type: "varchar", length: 100 })
  estate: string;

  @Column({ type: "decimal", precision: 8, scale: 5, transformer: decimal })
  latitude: number;

  @Column({ type: "decimal", precision: 8, scale: 5, transformer: decimal })
  longitude: number;

  @Column({ name: "updated_at", type: "datetime", precision: 3 })
  updatedAt: Date;
}
