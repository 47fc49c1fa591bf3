import { Column, Entity, PrimaryColumn } from "typeorm";

const decimal = { to: (v: number) => v, from: (v: string) => Number(v) };

/**
 * One hour of outdoor weather already fetched, for a 0.1° cell (about 11 km × 7 km in the UK): every
 * home in the cell shares it, so the service is asked once per cell and hour, not per home.
 */
@Entity({ name: "weather_hours" })
export class WeatherHour {
  /** Latitude × 10, rounded. */
  @PrimaryColumn({ name: "lat_tenths", type: "smallint" })
  latTenths: number;

  /** Longitude × 10, rounded. */
  @PrimaryColumn({ name: "lon_tenths", type: "smallint" })
  lonTenths: number;

  /** The start of the hour (UTC). */
  @PrimaryColumn({ name: "hour_at", type: "datetime", precision: 0 })
  hourAt: Date;

  @Column({ name: "temperature_c", type: "decimal", precision: 4, scale: 1, transformer: decimal })
  temperatureC: number;

  @Column({ name: "relative_humidity_pct", type: "decimal", precision: 4, scale: 1, transformer: decimal })
  relativeHumidityPct: number;

  /** When it was fetched (app clock): an hour later than this was a forecast then. */
  @Column({ name: "fetched_at", type: "datetime", precision: 3 })
  fetchedAt: Date;
}
