import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * The half-days an operative is booked for. An all-day booking holds both halves. The unique key
 * is what makes double-booking impossible: two bookings of one operative into the same half-day
 * cannot both be written, whatever the application does.
 */
@Entity({ name: "operative_slots" })
@Index("uq_operative_slots", ["userId", "slotDate", "half"], { unique: true })
@Index("idx_operative_slots_booking", ["bookingId"])
export class OperativeSlot {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  @Column({ name: "slot_date", type: "date" })
  slotDate: string;

  @Column({ type: "varchar", length: 2 })
  half: "am" | "pm";

  @Column({ name: "booking_id", type: "int", unsigned: true })
  bookingId: number;
}
