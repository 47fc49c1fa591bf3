// Readings from sensors, over HTTP and MQTT alike: each reading checked on its own (a refusal carries its
// reason and refuses only that reading), the rest stored in one transaction, a re-delivered reading a
// duplicate (the first value wins), then the listeners told. Built for bulk: a backfill of a million
// readings goes through here, so the hot loop uses no Date objects and no schema library per reading,
// and each batch is one LOAD DATA LOCAL … IGNORE of rows this file formats itself.
import { Readable } from "node:stream";
import type { PoolConnection, ResultSetHeader } from "mysql2";
import type { DataSource } from "typeorm";
import { SENSOR_LATE_LIMIT_DAYS } from "../../../src/lib/schemas/sensor-readings.js";
import { endOfLocalDay } from "../../../src/lib/domain/working-days.js";
import type { Clock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
import {
  AIR_TEMPERATURE_C,
  FUTURE_TOLERANCE_MS,
  RELATIVE_HUMIDITY_PCT,
  SURFACE_TEMPERATURE_C,
  formatNumber,
} from "../readings/csv/limits.js";
import { SENSOR_SECRET_PATTERN, sensorKeyHash } from "./credentials.js";
import type { IngestOutcome, SensorIdentity, SensorReadingsListener, StoredReadingsBatch } from "./sensor-events.js";

const DAY_MS = 86_400_000;
/**
 * A batch whose newest reading is older than this is a backfill (a device or gateway catching up). When
 * other ingests are in hand its listeners are told later, once the ingest has been idle for
 * BACKFILL_QUIET_MS (or BACKFILL_TELL_WITHIN_MS after the first was held, at the latest), in one batch
 * for all the sensors meanwhile: a burst of old readings is then not slowed by the rooms being worked
 * out again between its requests. Live readings, and a backfill on its own, are told at once. Our own
 * choice of numbers, no source.
 */
const BACKFILL_AGE_MS = 3_600_000;
const BACKFILL_QUIET_MS = 500;
const BACKFILL_TELL_WITHIN_MS = 30_000;
const BATTERY_PCT = { min: 0, max: 100 } as const;
/** The file name is never opened: the statement's stream factory supplies the rows from memory. */
const LOAD_SQL =
  "LOAD DATA LOCAL INFILE 'sensor-readings-stream' IGNORE INTO TABLE sensor_readings CHARACTER SET utf8mb4 " +
  "FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' " +
  "(sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at)";

/** `2026-12-05T06:45:00Z`, `…:00.123Z`, `…:00+01:00`: seconds required, a zone required. */
const TAKEN_AT = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(\.\d{1,9})?(Z|[+-]\d{2}:\d{2})$/;
const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

const pad2 = (n: number) => (n < 10 ? `0${n}` : String(n));

/** The reading time in ms (whole seconds, UTC), or a reason. No Date object on the common path. */
function parseTakenAt(text: string): number | string {
  const m = TAKEN_AT.exec(text);
  if (!m) {
    return /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/.test(text)
      ? "takenAt has no time zone: end it with Z or an offset such as +01:00."
      : "takenAt is not an ISO 8601 date and time (e.g. 2026-12-05T06:45:00Z).";
  }
  const year = +m[1]!;
  const month = +m[2]!;
  const day = +m[3]!;
  const hour = +m[4]!;
  const minute = +m[5]!;
  const second = +m[6]!;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (
    month < 1 ||
    month > 12 ||
    day < 1 ||
    day > (month === 2 && !leap ? 28 : DAYS_IN_MONTH[month - 1]!) ||
    hour > 23 ||
    minute > 59 ||
    second > 59
  ) {
    return "takenAt is not a real date and time.";
  }
  let ms = Date.UTC(year, month - 1, day, hour, minute, second);
  const zone = m[8]!;
  if (zone !== "Z") {
    const offsetMin = +zone.slice(1, 3) * 60 + +zone.slice(4, 6);
    if (+zone.slice(1, 3) > 23 || +zone.slice(4, 6) > 59) return "takenAt has an impossible offset.";
    ms -= (zone[0] === "-" ? -1 : 1) * offsetMin * 60_000;
  }
  return ms;
}

/** "YYYY-MM-DD HH:MM:SS" in UTC for MariaDB (the connection's zone is UTC). */
function sqlDateTime(ms: number, text: string): string {
  // The common case (Z, no fraction) is the text itself with a space.
  if (text.length === 20 && text.charCodeAt(19) === 90 /* Z */) return `${text.slice(0, 10)} ${text.slice(11, 19)}`;
  const d = new Date(ms);
  return `${d.getUTCFullYear()}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())} ${pad2(d.getUTCHours())}:${pad2(
    d.getUTCMinutes(),
  )}:${pad2(d.getUTCSeconds())}`;
}

const sqlDateTimeMs = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");
const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
/** Two decimals, as the columns keep them; never exponent notation for the column's range. */
const dec2 = (v: number) => String(Math.round(v * 100) / 100);

/** The days a sensor may record in: from the start of its installation day to the end of its removal day (London). */
interface SensorWindow {
  fromMs: number;
  toMs: number;
  active: boolean;
}

export class SensorIngestService {
  private readonly listeners: SensorReadingsListener[] = [];
  /** Ingest calls in progress (HTTP and MQTT alike). */
  private inFlight = 0;
  /** Backfilled sensors not told yet, by organisation then sensor; and since when (monotonic ms). */
  private readonly untold = new Map<number, { batch: StoredReadingsBatch; bySensor: Map<number, number> }>();
  private untoldSince = 0;
  private quietTimer: NodeJS.Timeout | null = null;

  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly logger?: Logger,
  ) {}

  /** Told after each commit that stored readings (the room watch, alerts). */
  addListener(listener: SensorReadingsListener): void {
    this.listeners.push(listener);
  }

  private async identify(where: string, value: string): Promise<SensorIdentity | null> {
    const rows: {
      id: number;
      organisation_id: number;
      property_id: number;
      room_id: number;
      serial: string;
      mqtt_username: string;
      interval_s: number;
      measures_surface: number;
    }[] = await this.dataSource.query(
      `SELECT id, organisation_id, property_id, room_id, serial, mqtt_username, interval_s, measures_surface
         FROM sensors WHERE ${where} = ? AND key_hash IS NOT NULL AND revoked_at IS NULL AND removed_on IS NULL`,
      [value],
    );
    const r = rows[0];
    if (!r) return null;
    return {
      id: r.id,
      organisationId: r.organisation_id,
      propertyId: r.property_id,
      roomId: r.room_id,
      serial: r.serial,
      mqttUsername: r.mqtt_username,
      intervalS: r.interval_s,
      measuresSurface: Boolean(r.measures_surface),
    };
  }

  /** The active sensor holding this secret (HTTP ingest), or null: unknown, revoked or removed. */
  async identifyByKey(secret: string): Promise<SensorIdentity | null> {
    if (!SENSOR_SECRET_PATTERN.test(secret)) return null;
    return this.identify("key_hash", sensorKeyHash(secret));
  }

  /** The active sensor with this MQTT user name (the broker has checked its password), or null. */
  async identifyByMqttUsername(username: string): Promise<SensorIdentity | null> {
    return this.identify("mqtt_username", username);
  }

  /** A room's sensors that are not removed (revoked ones included: their readings still count), oldest first. */
  async sensorsOfRoom(roomId: number): Promise<{ id: number; organisationId: number; propertyId: number; placement: string }[]> {
    const rows: { id: number; organisationId: number; propertyId: number; placement: string }[] = await this.dataSource.query(
      `SELECT id, organisation_id AS organisationId, property_id AS propertyId, placement
         FROM sensors WHERE room_id = ? AND removed_on IS NULL ORDER BY id`,
      [roomId],
    );
    return rows.map((r) => ({
      ...r,
      id: Number(r.id),
      organisationId: Number(r.organisationId),
      propertyId: Number(r.propertyId),
    }));
  }

  /** A sensor's readings over the `days` ending at its newest reading, oldest first. */
  async recentReadings(
    sensorId: number,
    days: number,
  ): Promise<{ at: Date; airTemperatureC: number; relativeHumidityPct: number; surfaceTemperatureC: number | null }[]> {
    const rows: { at: Date; airT: string | number; rh: string | number; surfaceT: string | number | null }[] =
      await this.dataSource.query(
        `SELECT r.taken_at AS at, r.air_temperature_c AS airT, r.relative_humidity_pct AS rh, r.surface_temperature_c AS surfaceT
           FROM sensor_readings r
          WHERE r.sensor_id = ?
            AND r.taken_at >= (SELECT MAX(taken_at) FROM sensor_readings WHERE sensor_id = ?) - INTERVAL ? DAY
          ORDER BY r.taken_at`,
        [sensorId, sensorId, days],
      );
    return rows.map((r) => ({
      at: new Date(r.at),
      airTemperatureC: Number(r.airT),
      relativeHumidityPct: Number(r.rh),
      surfaceTemperatureC: r.surfaceT === null ? null : Number(r.surfaceT),
    }));
  }

  private async windowOf(sensorId: number): Promise<SensorWindow | null> {
    const rows: { installed_on: string | Date; removed_on: string | Date | null; key_hash: string | null }[] =
      await this.dataSource.query("SELECT installed_on, removed_on, key_hash FROM sensors WHERE id = ?", [sensorId]);
    const r = rows[0];
    if (!r) return null;
    const date = (v: string | Date) => (typeof v === "string" ? v.slice(0, 10) : v.toISOString().slice(0, 10));
    const installed = date(r.installed_on);
    const dayBefore = new Date(Date.parse(`${installed}T00:00:00Z`) - DAY_MS).toISOString().slice(0, 10);
    return {
      fromMs: endOfLocalDay(dayBefore).getTime() + 1,
      toMs: r.removed_on === null ? Number.POSITIVE_INFINITY : endOfLocalDay(date(r.removed_on)).getTime(),
      active: r.key_hash !== null && r.removed_on === null,
    };
  }

  /**
   * Checks and stores a batch for one sensor. Each reading is stored, a duplicate of one stored before
   * (same sensor and second: the first value stays), or refused with its reason; one transaction for
   * all of it, then the listeners are told. The sensor is read again here, so one revoked or removed
   * after it was identified stores nothing.
   */
  async ingest(sensor: SensorIdentity, readings: unknown[], via: "http" | "mqtt"): Promise<IngestOutcome> {
    this.inFlight++;
    if (this.quietTimer) {
      clearTimeout(this.quietTimer);
      this.quietTimer = null;
    }
    try {
      return await this.checkAndStore(sensor, readings, via);
    } finally {
      this.inFlight--;
      if (this.untold.size > 0) {
        if (performance.now() - this.untoldSince > BACKFILL_TELL_WITHIN_MS) this.tellUntold();
        else if (this.inFlight === 0) {
          // unref: at shutdown the sweep of the room watch finds the rooms left behind.
          this.quietTimer = setTimeout(() => {
            this.quietTimer = null;
            this.tellUntold();
          }, BACKFILL_QUIET_MS).unref();
        }
      }
    }
  }

  private async checkAndStore(sensor: SensorIdentity, readings: unknown[], via: "http" | "mqtt"): Promise<IngestOutcome> {
    const refused: IngestOutcome["refused"] = [];
    const window = await this.windowOf(sensor.id);
    if (!window?.active) {
      readings.forEach((r, index) =>
        refused.push({ index, takenAt: takenAtText(r), reason: "This sensor is no longer active (revoked or removed)." }),
      );
      return { stored: 0, duplicates: 0, refused };
    }
    const receivedAt = this.clock.now();
    const nowMs = receivedAt.getTime();
    const latestMs = nowMs + FUTURE_TOLERANCE_MS;
    const earliestMs = nowMs - SENSOR_LATE_LIMIT_DAYS * DAY_MS;
    const received = sqlDateTimeMs(receivedAt);
    const prefix = `${sensor.id}\t`;

    const values: string[] = [];
    let newestMs = Number.NEGATIVE_INFINITY;
    for (let index = 0; index < readings.length; index++) {
      const r = readings[index] as Record<string, unknown> | null;
      if (typeof r !== "object" || r === null || Array.isArray(r)) {
        refused.push({ index, takenAt: null, reason: "Not a reading: each reading is an object." });
        continue;
      }
      const text = r.takenAt;
      if (typeof text !== "string") {
        refused.push({ index, takenAt: null, reason: "takenAt is missing or not text." });
        continue;
      }
      const reason = this.check(r, text, window, earliestMs, latestMs);
      if (typeof reason === "string") {
        refused.push({ index, takenAt: text.slice(0, 40), reason });
        continue;
      }
      if (reason > newestMs) newestMs = reason;
      const air = r.airTemperatureC as number;
      const rh = r.relativeHumidityPct as number;
      const surface = r.surfaceTemperatureC;
      const battery = r.batteryPct;
      values.push(
        `${prefix}${sqlDateTime(reason, text)}\t${dec2(air)}\t${dec2(rh)}\t${isNum(surface) ? dec2(surface) : "\\N"}\t${
          isNum(battery) ? String(Math.round(battery)) : "\\N"
        }\t${received}\n`,
      );
    }

    let stored = 0;
    if (values.length > 0) {
      const newest = sqlDateTime(newestMs, "");
      stored = await this.load(sensor.id, values, newest);
    }
    const outcome: IngestOutcome = { stored, duplicates: values.length - stored, refused };
    if (stored > 0) {
      const backfill = nowMs - newestMs > BACKFILL_AGE_MS;
      if (backfill && (this.inFlight > 1 || this.untold.size > 0)) this.holdBackfill(sensor, newestMs, receivedAt);
      else this.notify(sensor, new Date(newestMs), receivedAt);
    }
    if (refused.length > 0) {
      this.logger?.debug({ sensorId: sensor.id, via, refused: refused.length, first: refused[0] }, "sensor readings refused");
    }
    return outcome;
  }

  /**
   * One transaction: the rows through LOAD DATA LOCAL from memory (the stream technique of the stock
   * import; MariaDB takes it several times faster than the same rows as INSERT … VALUES), duplicates
   * skipped by IGNORE and counted from the affected rows, then last_reading_at moved forward.
   */
  private async load(sensorId: number, lines: string[], newest: string): Promise<number> {
    const runner = this.dataSource.createQueryRunner();
    const raw = (await runner.connect()) as PoolConnection;
    const db = raw.promise();
    try {
      await runner.startTransaction();
      try {
        const [loaded] = await db.query<ResultSetHeader>({
          sql: LOAD_SQL,
          infileStreamFactory: () => Readable.from([Buffer.from(lines.join(""), "utf8")]),
        });
        const inserted = loaded.affectedRows;
        if (inserted > 0) {
          await db.query("UPDATE sensors SET last_reading_at = GREATEST(COALESCE(last_reading_at, ?), ?) WHERE id = ?", [
            newest,
            newest,
            sensorId,
          ]);
        }
        await runner.commitTransaction();
        return inserted;
      } catch (err) {
        await runner.rollbackTransaction();
        throw err;
      }
    } finally {
      await runner.release();
    }
  }

  /** The reading's time in ms, or why it is refused. */
  private check(
    r: Record<string, unknown>,
    text: string,
    w: SensorWindow,
    earliestMs: number,
    latestMs: number,
  ): number | string {
    const ms = parseTakenAt(text);
    if (typeof ms === "string") return ms;
    if (ms > latestMs) return "takenAt is in the future (by the server's clock).";
    if (ms < earliestMs) return `takenAt is more than ${SENSOR_LATE_LIMIT_DAYS} days ago: too late to take in.`;
    if (ms < w.fromMs) return "takenAt is before the sensor was installed.";
    if (ms > w.toMs) return "takenAt is after the sensor was removed.";
    const air = r.airTemperatureC;
    if (!isNum(air)) return "airTemperatureC is missing or not a number.";
    if (air < AIR_TEMPERATURE_C.min || air > AIR_TEMPERATURE_C.max) {
      return `airTemperatureC ${formatNumber(air)} °C is outside ${formatNumber(AIR_TEMPERATURE_C.min)}…${AIR_TEMPERATURE_C.max} °C.`;
    }
    const rh = r.relativeHumidityPct;
    if (!isNum(rh)) return "relativeHumidityPct is missing or not a number.";
    if (rh <= RELATIVE_HUMIDITY_PCT.above || rh > RELATIVE_HUMIDITY_PCT.max) {
      return `relativeHumidityPct ${formatNumber(rh)} % is outside the range above 0 and up to 100 %.`;
    }
    const surface = r.surfaceTemperatureC;
    if (surface !== undefined && surface !== null) {
      if (!isNum(surface)) return "surfaceTemperatureC is not a number.";
      if (surface < SURFACE_TEMPERATURE_C.min || surface > SURFACE_TEMPERATURE_C.max) {
        return `surfaceTemperatureC ${formatNumber(surface)} °C is outside ${formatNumber(SURFACE_TEMPERATURE_C.min)}…${SURFACE_TEMPERATURE_C.max} °C.`;
      }
    }
    const battery = r.batteryPct;
    if (battery !== undefined && battery !== null) {
      if (!isNum(battery)) return "batteryPct is not a number.";
      if (battery < BATTERY_PCT.min || battery > BATTERY_PCT.max)
        return `batteryPct ${formatNumber(battery)} is outside 0…100 %.`;
    }
    return ms;
  }

  /** A backfilled sensor to tell about with the others once the ingest is quiet (see BACKFILL_AGE_MS). */
  private holdBackfill(sensor: SensorIdentity, newestMs: number, receivedAt: Date): void {
    if (this.untold.size === 0) this.untoldSince = performance.now();
    let org = this.untold.get(sensor.organisationId);
    if (!org) {
      org = { batch: { organisationId: sensor.organisationId, sensors: [], receivedAt }, bySensor: new Map() };
      this.untold.set(sensor.organisationId, org);
    }
    if (receivedAt > org.batch.receivedAt) org.batch.receivedAt = receivedAt;
    const at = org.bySensor.get(sensor.id);
    if (at === undefined) {
      org.bySensor.set(sensor.id, org.batch.sensors.length);
      org.batch.sensors.push({
        sensorId: sensor.id,
        roomId: sensor.roomId,
        propertyId: sensor.propertyId,
        newestTakenAt: new Date(newestMs),
      });
    } else if (newestMs > org.batch.sensors[at]!.newestTakenAt.getTime()) {
      org.batch.sensors[at]!.newestTakenAt = new Date(newestMs);
    }
  }

  private tellUntold(): void {
    const batches = [...this.untold.values()].map((o) => o.batch);
    this.untold.clear();
    for (const batch of batches) this.tell(batch);
  }

  private notify(sensor: SensorIdentity, newestTakenAt: Date, receivedAt: Date): void {
    this.tell({
      organisationId: sensor.organisationId,
      sensors: [{ sensorId: sensor.id, roomId: sensor.roomId, propertyId: sensor.propertyId, newestTakenAt }],
      receivedAt,
    });
  }

  /** After the commit; a listener's failure is logged and never reaches the device. */
  private tell(batch: StoredReadingsBatch): void {
    for (const listener of this.listeners) {
      try {
        listener.readingsStored(batch);
      } catch (err) {
        this.logger?.error({ err, sensorIds: batch.sensors.map((s) => s.sensorId) }, "a sensor readings listener failed");
      }
    }
  }
}

function takenAtText(r: unknown): string | null {
  const t = (r as { takenAt?: unknown } | null)?.takenAt;
  return typeof t === "string" ? t.slice(0, 40) : null;
}
