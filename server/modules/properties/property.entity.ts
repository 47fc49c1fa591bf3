import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn } from "typeorm";
import { Organisation } from "../organisations/organisation.entity.js";
// Named, not imported as a value: Room refers back to Property, and ES modules must not load in a circle.
import type { Room } from "./room.entity.js";
import type { EpcBand, HeatingFuel, WallInsulation } from "../../../src/lib/domain/stock-register.js";

export const BUILT_FORMS = ["detached", "semi-detached", "end-terrace", "mid-terrace", "flat", "maisonette", "bungalow"] as const;
export const WALL_TYPES = [
  "solid-brick",
  "solid-stone",
  "unfilled-cavity",
  "filled-cavity",
  "system-built",
  "timber-frame",
  "insulated",
] as const;
export const GLAZING_TYPES = ["single", "old-double", "modern-double", "triple", "mixed"] as const;
export const HEATING_TYPES = [
  "gas-boiler",
  "electric-storage",
  "electric-direct",
  "heat-pump",
  "district",
  "other",
  "none",
] as const;
/** How the home is ventilated, as far as the landlord has recorded it (the trade's own terms). */
export const VENTILATION_TYPES = [
  "not-recorded",
  "windows-only",
  "trickle-vents",
  "extract-fans",
  "trickle-vents-and-fans",
  "continuous-extract",
  "piv",
  "mvhr",
] as const;
export type BuiltForm = (typeof BUILT_FORMS)[number];
export type WallType = (typeof WALL_TYPES)[number];
export type GlazingType = (typeof GLAZING_TYPES)[number];
export type HeatingType = (typeof HEATING_TYPES)[number];
export type VentilationType = (typeof VENTILATION_TYPES)[number];

const nullableDecimal = {
  to: (v: number | null | undefined) => v,
  from: (v: string | null) => (v === null ? null : Number(v)),
};

@Entity({ name: "properties" })
@Index("idx_properties_org_estate", ["organisationId", "estate"])
@Index("idx_properties_org_postcode", ["organisationId", "postcode"])
// The queue's text search tests these columns of every home: from this index alone, not the rows.
@Index("idx_properties_org_address", ["organisationId", "addressLine1", "town", "postcode"])
@Index("idx_properties_org_sort", ["organisationId", "estate", "sortKey"])
@Index("uq_properties_org_uprn", ["organisationId", "uprn"], { unique: true })
export class Property {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @ManyToOne(() => Organisation, { onDelete: "RESTRICT" })
  @JoinColumn({ name: "organisation_id" })
  organisation?: Organisation;

  @Column({ name: "address_line1", type: "varchar", length: 190 })
  addressLine1: string;

  @Column({ name: "address_line2", type: "varchar", length: 190, nullable: true })
  addressLine2: string | null;

  @Column({ type: "varchar", length: 100 })
  town: string;

  /** Upper case with one space, e.g. "AB1 2CD". */
  @Column({ type: "varchar", length: 10 })
  postcode: string;

  /** Unique Property Reference Number (up to 12 digits), where the landlord knows it. */
  @Column({ type: "varchar", length: 12, nullable: true })
  uprn: string | null;

  @Column({ type: "varchar", length: 100 })
  estate: string;

  @Column({ type: "varchar", length: 100, nullable: true })
  block: string | null;

  @Column({ name: "built_form", type: "varchar", length: 20 })
  builtForm: BuiltForm;

  @Column({ name: "wall_type", type: "varchar", length: 20 })
  wallType: WallType;

  @Column({ name: "glazing_type", type: "varchar", length: 20 })
  glazingType: GlazingType;

  @Column({ name: "heating_type", type: "varchar", length: 20 })
  heatingType: HeatingType;

  @Column({ type: "varchar", length: 30, default: "not-recorded" })
  ventilation: VentilationType;

  /** The year the home was built, when the register knows it to the year. */
  @Column({ name: "built_year", type: "smallint", unsigned: true, nullable: true })
  builtYear: number | null;

  /** Otherwise its age band as the register gives it, e.g. "1945-1964", "before 1919", "2012 onwards". */
  @Column({ name: "age_band", type: "varchar", length: 20, nullable: true })
  ageBand: string | null;

  @Column({ name: "wall_insulation", type: "varchar", length: 20, nullable: true })
  wallInsulation: WallInsulation | null;

  /** Roof or loft insulation in millimetres (0: none). */
  @Column({ name: "roof_insulation_mm", type: "smallint", unsigned: true, nullable: true })
  roofInsulationMm: number | null;

  @Column({ name: "heating_fuel", type: "varchar", length: 20, nullable: true })
  heatingFuel: HeatingFuel | null;

  @Column({ name: "has_extract_fans", type: "boolean", nullable: true })
  hasExtractFans: boolean | null;

  @Column({ name: "has_trickle_vents", type: "boolean", nullable: true })
  hasTrickleVents: boolean | null;

  @Column({
    name: "floor_area_m2",
    type: "decimal",
    precision: 6,
    scale: 1,
    nullable: true,
    transformer: { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) },
  })
  floorAreaM2: number | null;

  @Column({ name: "epc_band", type: "char", length: 1, nullable: true })
  epcBand: EpcBand | null;

  /** Where the home is (WGS84 degrees), for its outdoor weather; else its estate's location is used. */
  @Column({ type: "decimal", precision: 8, scale: 5, nullable: true, transformer: nullableDecimal })
  latitude: number | null;

  @Column({ type: "decimal", precision: 8, scale: 5, nullable: true, transformer: nullableDecimal })
  longitude: number | null;

  /**
   * The natural sort key of block and address, set by MariaDB's triggers on every insert and update
   * (migration HomesSortKeyAndVentilation): NATURAL_SORT_KEY puts each run of digits behind its length,
   * so "Flat 2" sorts before "Flat 10". Read-only here.
   */
  @Column({ name: "sort_key", type: "varchar", length: 400, default: "", insert: false, update: false, select: false })
  sortKey?: string;

  @OneToMany("Room", (room: Room) => room.property)
  rooms?: Room[];

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;
}
