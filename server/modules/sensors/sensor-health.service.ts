import type { DataSource } from "typeorm";
import {
  HEALTH_WINDOW_MS,
  offlineFinding,
  sensorHealth,
  type HealthReading,
  type SensorHealth,
  type SensorHealthFinding,
  type SensorProblem,
} from "../../../src/lib/domain/sensor-health.js";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError } from "../../lib/errors.js";

/** A stored check is done again after this long when it found a problem, so a jump ages out of the 24 h window. */
const RECHECK_FLAGGED_MS = 3600_000;
/** Sensors whose readings are read in one query by the sweep. */
const SWEEP_BATCH = 200;

export interface SensorHealthView extends SensorHealth {
  sensorId: number;
  serial: string;
  intervalS: number;
  lastReadingAt: Date | null;
  checkedAt: Date;
}

export interface SensorHealthSummary {
  total: number;
  ok: number;
  needingAttention: number;
  counts: Record<SensorProblem, number>;
  oldestCheckAt: Date | null;
  at: Date;
}

export interface SensorAttentionRow {
  sensor: { id: number; serial: string; placement: string; intervalS: number };
  home: { id: number; addressLine1: string; town: string; postcode: string };
  room: { id: number; name: string };
  lastReadingAt: Date | null;
  findings: SensorHealthFinding[];
  checkedAt: Date | null;
}

export interface AttentionQuery {
  problem?: SensorProblem;
  page: number;
  pageSize: number;
}

interface SensorRow {
  id: number;
  intervalS: number;
  lastReadingAt: Date | null;
  watchedSince: Date;
}

interface ReadingRow {
  sensorId: number;
  takenAt: Date;
  airTemperatureC: string;
  relativeHumidityPct: string;
  surfaceTemperatureC: string | null;
  batteryPct: number | null;
}

const num = (v: string | number) => Number(v);
const toReading = (r: ReadingRow): HealthReading => ({
  takenAt: r.takenAt,
  airTemperatureC: num(r.airTemperatureC),
  relativeHumidityPct: num(r.relativeHumidityPct),
  surfaceTemperatureC: r.surfaceTemperatureC === null ? null : num(r.surfaceTemperatureC),
  batteryPct: r.batteryPct === null ? null : num(r.batteryPct),
});

/**
 * Where the silence of a sensor that never reported starts: its key being issued, else its registration.
 * The same expression in SQL (offline is counted there) and for one sensor (worked out here).
 */
const WATCHED_SINCE_SQL = "COALESCE(s.key_issued_at, s.created_at)";
const HEARD_SQL = `COALESCE(s.last_reading_at, ${WATCHED_SINCE_SQL})`;
/** Offline: silent for at least twice the interval (TIMESTAMPDIFF rounds down, so ≥ holds as in the domain). */
const OFFLINE_SQL = `(TIMESTAMPDIFF(SECOND, ${HEARD_SQL}, ?) >= 2 * s.interval_s)`;
/** Sensors in use: not revoked, not removed by today (London). */
const IN_USE_SQL = "s.organisation_id = ? AND s.revoked_at IS NULL AND (s.removed_on IS NULL OR s.removed_on > ?)";
/** A stored problem still counts only while its check is for the sensor's current readings or recent. */
const STORED_SQL: Record<Exclude<SensorProblem, "offline">, string> = {
  "low-battery": "h.low_battery_since IS NOT NULL",
  "flat-lined": "h.flat_since IS NOT NULL",
  jumping: "h.jump_since IS NOT NULL",
};
const ANY_SQL = `(${OFFLINE_SQL} OR ${Object.values(STORED_SQL).join(" OR ")})`;

/**
 * Sensor health for a landlord's lead. One sensor's health is worked out from its readings when asked;
 * the summary and the list of sensors needing attention read each sensor's stored check (the sweep keeps
 * it current for sensors with new readings) and work out offline from `sensors.last_reading_at`, so they
 * never read readings, however many sensors there are.
 */
export class SensorHealthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
  ) {}

  /** One sensor of the landlord's, from its readings of the last 24 hours. 404 when it is not theirs. */
  async forSensor(organisationId: number, sensorId: number): Promise<SensorHealthView> {
    const now = this.clock.now();
    const rows: (SensorRow & { serial: string })[] = await this.dataSource.query(
      `SELECT s.id, s.serial, s.interval_s AS intervalS, s.last_reading_at AS lastReadingAt, ${WATCHED_SINCE_SQL} AS watchedSince
         FROM sensors s WHERE s.id = ? AND s.organisation_id = ?`,
      [sensorId, organisationId],
    );
    const sensor = rows[0];
    if (!sensor) throw new NotFoundError("No such sensor.");
    const readings = await this.recentReadings([sensor.id], now);
    const health = sensorHealth({ ...sensor, readings: readings.get(sensor.id) ?? [], now });
    return {
      sensorId: sensor.id,
      serial: sensor.serial,
      intervalS: sensor.intervalS,
      lastReadingAt: sensor.lastReadingAt,
      checkedAt: now,
      ...health,
    };
  }

  async summary(organisationId: number): Promise<SensorHealthSummary> {
    const now = this.clock.now();
    const [row] = (await this.dataSource.query(
      `SELECT COUNT(*) AS total,
              COALESCE(SUM(${ANY_SQL}), 0) AS needingAttention,
              COALESCE(SUM(${OFFLINE_SQL}), 0) AS offline,
              COALESCE(SUM(${STORED_SQL["low-battery"]}), 0) AS lowBattery,
              COALESCE(SUM(${STORED_SQL["flat-lined"]}), 0) AS flatLined,
              COALESCE(SUM(${STORED_SQL.jumping}), 0) AS jumping,
              MIN(h.evaluated_at) AS oldestCheckAt
         FROM sensors s LEFT JOIN sensor_health h ON h.sensor_id = s.id
        WHERE ${IN_USE_SQL}`,
      [now, now, organisationId, localDate(now)],
    )) as Record<string, string | number | Date | null>[];
    const count = (k: string) => Number(row?.[k] ?? 0);
    const needingAttention = count("needingAttention");
    return {
      total: count("total"),
      ok: count("total") - needingAttention,
      needingAttention,
      counts: {
        offline: count("offline"),
        "low-battery": count("lowBattery"),
        "flat-lined": count("flatLined"),
        jumping: count("jumping"),
      },
      oldestCheckAt: (row?.oldestCheckAt as Date | null) ?? null,
      at: now,
    };
  }

  /** The sensors needing attention (or with one problem), by home, room and serial. */
  async needingAttention(
    organisationId: number,
    { problem, page, pageSize }: AttentionQuery,
  ): Promise<{ items: SensorAttentionRow[]; total: number }> {
    const now = this.clock.now();
    const filter = problem === undefined ? ANY_SQL : problem === "offline" ? OFFLINE_SQL : `(${STORED_SQL[problem]})`;
    const filterParams = problem === undefined ? [now] : problem === "offline" ? [now] : [];
    const where = `${IN_USE_SQL} AND ${filter}`;
    const params = [organisationId, localDate(now), ...filterParams];
    const [counted] = (await this.dataSource.query(
      `SELECT COUNT(*) AS total FROM sensors s LEFT JOIN sensor_health h ON h.sensor_id = s.id WHERE ${where}`,
      params,
    )) as { total: string | number }[];
    const rows: Record<string, unknown>[] = await this.dataSource.query(
      `SELECT s.id, s.serial, s.placement, s.interval_s AS intervalS, s.last_reading_at AS lastReadingAt,
              ${WATCHED_SINCE_SQL} AS watchedSince,
              p.id AS homeId, p.address_line1 AS addressLine1, p.town, p.postcode, r.id AS roomId, r.name AS roomName,
              h.evaluated_at AS checkedAt, h.low_battery_since AS lowBatterySince, h.low_battery_reason AS lowBatteryReason,
              h.flat_since AS flatSince, h.flat_reason AS flatReason, h.jump_since AS jumpSince, h.jump_reason AS jumpReason
         FROM sensors s
         LEFT JOIN sensor_health h ON h.sensor_id = s.id
         JOIN properties p ON p.id = s.property_id
         JOIN rooms r ON r.id = s.room_id
        WHERE ${where}
        ORDER BY p.sort_key, p.id, r.name, s.serial
        LIMIT ? OFFSET ?`,
      [...params, pageSize, (page - 1) * pageSize],
    );
    const items = rows.map((x): SensorAttentionRow => {
      const stored = (p: SensorProblem, since: unknown, reason: unknown): SensorHealthFinding[] =>
        since ? [{ problem: p, since: since as Date, reason: String(reason) }] : [];
      const offline = offlineFinding(Number(x.intervalS), (x.lastReadingAt as Date | null) ?? null, x.watchedSince as Date, now);
      return {
        sensor: { id: Number(x.id), serial: String(x.serial), placement: String(x.placement), intervalS: Number(x.intervalS) },
        home: {
          id: Number(x.homeId),
          addressLine1: String(x.addressLine1),
          town: String(x.town),
          postcode: String(x.postcode),
        },
        room: { id: Number(x.roomId), name: String(x.roomName) },
        lastReadingAt: (x.lastReadingAt as Date | null) ?? null,
        findings: [
          ...(offline ? [offline] : []),
          ...stored("low-battery", x.lowBatterySince, x.lowBatteryReason),
          ...stored("flat-lined", x.flatSince, x.flatReason),
          ...stored("jumping", x.jumpSince, x.jumpReason),
        ],
        checkedAt: (x.checkedAt as Date | null) ?? null,
      };
    });
    return { items, total: Number(counted?.total ?? 0) };
  }

  /**
   * Checks the readings of sensors that have new readings since their last check (or none yet), and of
   * those with a stored problem checked over an hour ago, at most `limit` of them; stores each result.
   * Returns the ids of the sensors checked. Safe to run on several instances at once (the result is the same).
   */
  async sweep(limit = 2000): Promise<number[]> {
    const now = this.clock.now();
    const due: SensorRow[] = await this.dataSource.query(
      `SELECT s.id, s.interval_s AS intervalS, s.last_reading_at AS lastReadingAt, ${WATCHED_SINCE_SQL} AS watchedSince
         FROM sensors s LEFT JOIN sensor_health h ON h.sensor_id = s.id
        WHERE s.revoked_at IS NULL AND s.last_reading_at IS NOT NULL
          AND (h.sensor_id IS NULL OR h.readings_through < s.last_reading_at
               OR (h.evaluated_at < ? AND (${Object.values(STORED_SQL).join(" OR ")})))
        LIMIT ?`,
      [new Date(now.getTime() - RECHECK_FLAGGED_MS), limit],
    );
    for (let i = 0; i < due.length; i += SWEEP_BATCH) {
      const batch = due.slice(i, i + SWEEP_BATCH);
      const readings = await this.recentReadings(
        batch.map((s) => s.id),
        now,
      );
      const values = batch.map((s) => {
        const { findings } = sensorHealth({ ...s, readings: readings.get(s.id) ?? [], now });
        const of = (p: SensorProblem) => findings.find((f) => f.problem === p);
        const low = of("low-battery");
        const flat = of("flat-lined");
        const jump = of("jumping");
        return [
          s.id,
          s.lastReadingAt,
          now,
          low?.since ?? null,
          low?.reason ?? null,
          flat?.since ?? null,
          flat?.reason ?? null,
          jump?.since ?? null,
          jump?.reason ?? null,
        ];
      });
      await this.dataSource.query(
        `INSERT INTO sensor_health (sensor_id, readings_through, evaluated_at, low_battery_since, low_battery_reason,
                                    flat_since, flat_reason, jump_since, jump_reason)
         VALUES ${values.map(() => "(?, ?, ?, ?, ?, ?, ?, ?, ?)").join(", ")}
         ON DUPLICATE KEY UPDATE readings_through = VALUES(readings_through), evaluated_at = VALUES(evaluated_at),
           low_battery_since = VALUES(low_battery_since), low_battery_reason = VALUES(low_battery_reason),
           flat_since = VALUES(flat_since), flat_reason = VALUES(flat_reason),
           jump_since = VALUES(jump_since), jump_reason = VALUES(jump_reason)`,
        values.flat(),
      );
    }
    return due.map((s) => Number(s.id));
  }

  /** The sensors' readings of the 24 hours before now, oldest first, read along the (sensor, time) key. */
  private async recentReadings(sensorIds: number[], now: Date): Promise<Map<number, HealthReading[]>> {
    const rows: ReadingRow[] = await this.dataSource.query(
      `SELECT sensor_id AS sensorId, taken_at AS takenAt, air_temperature_c AS airTemperatureC,
              relative_humidity_pct AS relativeHumidityPct, surface_temperature_c AS surfaceTemperatureC, battery_pct AS batteryPct
         FROM sensor_readings
        WHERE sensor_id IN (?) AND taken_at > ? AND taken_at <= ?
        ORDER BY sensor_id, taken_at`,
      [sensorIds, new Date(now.getTime() - HEALTH_WINDOW_MS), now],
    );
    const out = new Map<number, HealthReading[]>();
    for (const r of rows) {
      const list = out.get(r.sensorId) ?? [];
      list.push(toReading(r));
      out.set(r.sensorId, list);
    }
    return out;
  }
}
