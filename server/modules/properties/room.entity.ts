import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import { Property } from "./property.entity.js";

export const ROOM_KINDS = ["bedroom", "living", "kitchen", "bathroom", "other"] as const;
export type RoomKind = (typeof ROOM_KINDS)[number];

@Entity({ name: "rooms" })
@Index("idx_rooms_property", ["propertyId"])
export class Room {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  @ManyToOne(() => Property, (property) => property.rooms, { onDelete: "CASCADE" })
  @JoinColumn({ name: "property_id" })
  property?: Property;

  @Column({ type: "varchar", length: 100 })
  name: string;

  @Column({ type: "varchar", length: 20 })
  kind: RoomKind;
}
