import { Column, Entity, PrimaryColumn } from "typeorm";

/** Who gets a landlord's monthly board report (kept by its admins). */
@Entity({ name: "board_report_settings" })
export class BoardReportSettings {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** E-mail addresses, lower case, each once. */
  @Column({
    type: "text",
    transformer: {
      to: (v: string[] | undefined) => (v === undefined ? v : JSON.stringify(v)),
      from: (v: string | null) => (v === null ? [] : (JSON.parse(v) as string[])),
    },
  })
  recipients: string[];

  @Column({ name: "updated_by_id", type: "int", unsigned: true, nullable: true })
  updatedById: number | null;

  @Column({ name: "updated_at", type: "datetime", precision: 3 })
  updatedAt: Date;
}

/** Each month's report e-mailed to a landlord's list: one row per (landlord, month), so the scheduler sends it once. */
@Entity({ name: "board_report_sends" })
export class BoardReportSend {
  @PrimaryColumn({ name: "organisation_id", type: "int", unsigned: true })
  organisationId: number;

  /** YYYY-MM. */
  @PrimaryColumn({ type: "char", length: 7 })
  month: string;

  @Column({ name: "sent_at", type: "datetime", precision: 3 })
  sentAt: Date;

  /** How many addresses it went to. */
  @Column({ type: "smallint", unsigned: true })
  recipients: number;

  /** The admin who sent it; null when the monthly scheduler did. */
  @Column({ name: "sent_by_id", type: "int", unsigned: true, nullable: true })
  sentById: number | null;
}
