// One room's evaluation worked out from the database on a worker thread: the readings are read and
// turned into numbers here, not on the request thread, in pages so no single result set is huge.
// The readings and the room's readings_version are read in one consistent snapshot, so the result
// is stored only if nothing changed since (ReadingService.roomEvaluations).
import mysql from "mysql2/promise";
import { evaluateSeries, type ElementId, type SeriesResult } from "../../../src/lib/domain/index.js";
import type { SeriesPoint } from "./reading.service.js";

export interface RoomEvaluationInput {
  db: { host: string; port: number; user: string; password: string; name: string };
  caseId: number;
  roomId: number;
  element?: ElementId;
  surfaceWet: boolean;
  /**
   * Outdoor air from the weather service, hour by hour from `startMs` (null: no value that hour), for
   * readings that carry no outdoor temperature: each takes the hour it falls in.
   */
  outdoorHours?: { startMs: number; temperatureC: (number | null)[]; relativeHumidityPct: (number | null)[] };
}

export interface StoredRoomEvaluation {
  readingsCount: number;
  latest: {
    takenAt: string;
    airTemperatureC: number;
    relativeHumidityPct: number;
    surfaceTemperatureC: number | null;
    outdoorTemperatureC: number | null;
    /** True when outdoorTemperatureC came from the weather service, not from the reading. */
    outdoorFromWeather?: boolean;
  } | null;
  series: SeriesResult | null;
  /** How many readings took their outdoor temperature and humidity from the weather service. */
  outdoorFromWeather?: number;
}

const PAGE = 100_000;

type Row = [Date, string, string, string | null, string | null];

export async function evaluateRoomFromDb(
  input: RoomEvaluationInput,
): Promise<{ version: number; evaluation: StoredRoomEvaluation }> {
  const connection = await mysql.createConnection({
    host: input.db.host,
    port: input.db.port,
    user: input.db.user,
    password: input.db.password,
    database: input.db.name,
    // As the app's data source: every DATETIME holds UTC.
    timezone: "Z",
    connectTimeout: 5_000,
  });
  const readings: SeriesPoint[] = [];
  let version = 0;
  try {
    await connection.query("START TRANSACTION WITH CONSISTENT SNAPSHOT, READ ONLY");
    const [versions] = await connection.query<mysql.RowDataPacket[]>(
      "SELECT readings_version FROM room_evaluations WHERE case_id = ? AND room_id = ?",
      [input.caseId, input.roomId],
    );
    version = Number(versions[0]?.readings_version ?? 0);
    let after = new Date(0);
    for (;;) {
      const [rows] = await connection.query<mysql.RowDataPacket[]>({
        sql:
          "SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c FROM readings " +
          "WHERE case_id = ? AND room_id = ? AND taken_at > ? ORDER BY taken_at LIMIT ?",
        values: [input.caseId, input.roomId, after, PAGE],
        rowsAsArray: true,
      });
      // The same shaping as ReadingService.seriesFor, so the numbers are the same.
      for (const r of rows as unknown as Row[]) {
        const reading: SeriesPoint = { at: r[0], airTemperatureC: Number(r[1]), relativeHumidityPct: Number(r[2]) };
        if (r[3] !== null) reading.surfaceTemperatureC = Number(r[3]);
        if (r[4] !== null) reading.outdoorTemperatureC = Number(r[4]);
        readings.push(reading);
      }
      if (rows.length < PAGE) break;
      after = readings[readings.length - 1]!.at;
    }
    await connection.query("COMMIT");
  } finally {
    await connection.end();
  }
  if (readings.length === 0) return { version, evaluation: { readingsCount: 0, latest: null, series: null } };
  const fromWeather = input.outdoorHours ? fillOutdoorFromWeather(readings, input.outdoorHours) : new Set<SeriesPoint>();
  const last = readings[readings.length - 1]!;
  return {
    version,
    evaluation: {
      readingsCount: readings.length,
      latest: {
        takenAt: last.at.toISOString(),
        airTemperatureC: last.airTemperatureC,
        relativeHumidityPct: last.relativeHumidityPct,
        surfaceTemperatureC: last.surfaceTemperatureC ?? null,
        outdoorTemperatureC: last.outdoorTemperatureC ?? null,
        ...(fromWeather.has(last) ? { outdoorFromWeather: true } : {}),
      },
      series: evaluateSeries({ readings, element: input.element, surfaceWet: input.surfaceWet }),
      ...(fromWeather.size > 0 ? { outdoorFromWeather: fromWeather.size } : {}),
    },
  };
}

/** Gives each reading without an outdoor temperature the weather of the hour it falls in; returns those filled. */
function fillOutdoorFromWeather(
  readings: SeriesPoint[],
  hours: NonNullable<RoomEvaluationInput["outdoorHours"]>,
): Set<SeriesPoint> {
  const filled = new Set<SeriesPoint>();
  for (const r of readings) {
    if (r.outdoorTemperatureC !== undefined) continue;
    const i = Math.floor((r.at.getTime() - hours.startMs) / 3_600_000);
    const t = hours.temperatureC[i];
    const rh = hours.relativeHumidityPct[i];
    if (t === undefined || t === null || rh === undefined || rh === null) continue;
    r.outdoorTemperatureC = t;
    r.outdoorRelativeHumidityPct = rh;
    filled.add(r);
  }
  return filled;
}
