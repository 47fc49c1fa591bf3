import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, VersionColumn } from "typeorm";

/**
 * A temperature and humidity sensor fitted in a room of a landlord's home. Its one secret (shown
 * once, when issued) is kept only as two hashes: SHA-256 for the HTTP ingest and mosquitto's own
 * PBKDF2 form for its MQTT password file. Revoking clears both.
 */
@Entity({ name: "sensors" })
@Index("uq_sensors_org_serial", ["organisationId", "serial"], { unique: true })
@Index("uq_sensors_mqtt_username", ["mqttUsername"], { unique: true })
@Index("uq_sensors_key_hash", ["keyHash"], { unique: true })
@Index("idx_sensors_room", ["roomId"])
@Index("idx_sensors_property", ["propertyId"])
export class Sensor {
  @PrimaryGeneratedColumn({ type: "int", unsigned: true })
  id: number;

  @Column({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  @Column({ name: "property_id", type: "int", unsigned: true })
  propertyId: number;

  @Column({ name: "room_id", type: "int", unsigned: true })
  roomId: number;

  /** The maker's serial number, unique within a landlord. */
  @Column({ type: "varchar", length: 64 })
  serial: string;

  @Column({ type: "varchar", length: 100 })
  model: string;

  /** Where in the room it sits, in the fitter's words ("external wall corner, 0.3 m above floor"). */
  @Column({ type: "varchar", length: 200 })
  placement: string;

  /** True when it has a probe on a surface, so it reports a surface temperature too. */
  @Column({ name: "measures_surface", type: "boolean", default: false })
  measuresSurface: boolean;

  /** How often it reports, in seconds. */
  @Column({ name: "interval_s", type: "int", unsigned: true, default: 900 })
  intervalS: number;

  /** Local calendar date (YYYY-MM-DD). */
  @Column({ name: "installed_on", type: "date" })
  installedOn: string;

  @Column({ name: "removed_on", type: "date", nullable: true })
  removedOn: string | null;

  /** Its MQTT user name and the last part of its topic: "s" and its id. */
  @Column({ name: "mqtt_username", type: "varchar", length: 40 })
  mqttUsername: string;

  /** SHA-256 (hex) of its secret; null when revoked or not yet issued. */
  @Column({ name: "key_hash", type: "char", length: 64, nullable: true })
  keyHash: string | null;

  /** Its secret in mosquitto's password-file form ($7$ PBKDF2-SHA512); null when revoked. */
  @Column({ name: "mqtt_password_hash", type: "varchar", length: 255, nullable: true })
  mqttPasswordHash: string | null;

  @Column({ name: "key_issued_at", type: "datetime", precision: 3, nullable: true })
  keyIssuedAt: Date | null;

  @Column({ name: "revoked_at", type: "datetime", precision: 3, nullable: true })
  revokedAt: Date | null;

  /** The last reading time stored (UTC), kept so lists and health need not scan readings. */
  @Column({ name: "last_reading_at", type: "datetime", precision: 0, nullable: true })
  lastReadingAt: Date | null;

  @CreateDateColumn({ name: "created_at", type: "datetime", precision: 3, default: () => "CURRENT_TIMESTAMP(3)" })
  createdAt: Date;

  @VersionColumn({ default: 1 })
  version: number;
}
