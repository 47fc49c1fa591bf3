import { Column, Entity, PrimaryColumn } from "typeorm";

/**
 * A tenant's choice about text messages: their mobile number and whether they want texts. Texts are
 * off until the tenant turns them on themselves (no row: off), so nobody is texted without asking.
 * Owned by the sms module; one row per user.
 */
@Entity({ name: "sms_preferences" })
export class SmsPreference {
  @PrimaryColumn({ name: "user_id", type: "int", unsigned: true })
  userId: number;

  /** The number in one form (+447…), or null when none is given. */
  @Column({ name: "mobile_number", type: "varchar", length: 16, nullable: true })
  mobileNumber: string | null;

  @Column({ name: "texts_on", type: "boolean", default: false })
  textsOn: boolean;

  /** When the tenant last turned texts on (their consent), and off. */
  @Column({ name: "opted_in_at", type: "datetime", precision: 3, nullable: true })
  optedInAt: Date | null;

  @Column({ name: "opted_out_at", type: "datetime", precision: 3, nullable: true })
  optedOutAt: Date | null;

  /** When it last changed, by the app's clock. */
  @Column({ name: "updated_at", type: "datetime", precision: 3 })
  updatedAt: Date;
}
