// Readings from sensors, over HTTP (JSON or CSV) and MQTT alike: each reading checked on its own (a
// refusal carries its reason and refuses only that reading; reading-checks.ts, readings-csv.ts), the rest
// stored in one transaction, a re-delivered reading a duplicate (the first value wins), then the listeners
// told. Built for bulk: a backfill of a million readings goes through here, so the checks use no Date
// objects and no schema library per reading, and each batch is one LOAD DATA LOCAL … IGNORE.
import { Readable } from "node:stream";
import type { PoolConnection, ResultSetHeader } from "mysql2";
import pLimit from "p-limit";
import type { DataSource } from "typeorm";
import { SENSOR_LATE_LIMIT_DAYS } from "../../../src/lib/schemas/sensor-readings.js";
import { endOfLocalDay } from "../../../src/lib/domain/working-days.js";
import type { Clock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
import { FUTURE_TOLERANCE_MS } from "../readings/csv/limits.js";
import { SENSOR_SECRET_PATTERN, sensorKeyHash } from "./credentials.js";
import { checkJsonReadings, sqlDateTime, type CheckedBatch, type ReadingLimits, type SensorWindow } from "./reading-checks.js";
import { checkCsvReadings } from "./readings-csv.js";
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
/**
 * Batches of at least this many readings are loaded one at a time (per app instance), while the next
 * ones are being read and checked; smaller ones (live readings) never wait for them. Two bulk loads side
 * by side into the one table took MariaDB twice the CPU for no more rows a second (measured on 2 cores,
 * December 2026: 200 loads of 5 000 rows, 2.4–2.9 CPU-s one at a time, 5.1–5.6 two at a time).
 */
const BULK_ROWS = 1000;

/**
 * The file name is never opened: the statement's stream factory supplies the rows from memory. The
 * sensor and the arrival time are the statement's own (both made here: an id and the clock's time), not
 * repeated in every row.
 */
const loadSql = (sensorId: number, received: string) =>
  "LOAD DATA LOCAL INFILE 'sensor-readings-stream' IGNORE INTO TABLE sensor_readings CHARACTER SET utf8mb4 " +
  "FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' " +
  "(taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct) " +
  `SET sensor_id = ${Math.trunc(sensorId)}, received_at = TIMESTAMP'${received}'`;
/** Rows go to MariaDB in pieces of at most this size, well under its max_allowed_packet (16 MB by default). */
const LOAD_CHUNK_BYTES = 1 << 20;

function* chunks(rows: Buffer): Generator<Buffer> {
  for (let at = 0; at < rows.length; at += LOAD_CHUNK_BYTES) yield rows.subarray(at, at + LOAD_CHUNK_BYTES);
}

const sqlDateTimeMs = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");

export class SensorIngestService {
  private readonly listeners: SensorReadingsListener[] = [];
  /** Ingest calls in progress (HTTP and MQTT alike). */
  private inFlight = 0;
  /** Backfilled sensors not told yet, by organisation then sensor; and since when (monotonic ms). */
  private readonly untold = new Map<number, { batch: StoredReadingsBatch; bySensor: Map<number, number> }>();
  private untoldSince = 0;
  private quietTimer: NodeJS.Timeout | null = null;
  /** Bulk LOAD DATA statements run one at a time (see BULK_ROWS). */
  private readonly bulkLoads = pLimit(1);

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

  /**
   * A sensor's readings over the `days` ending at its newest reading, oldest first. Two statements: the
   * newest reading's time first, so that the window is constants MariaDB prunes the monthly partitions by
   * (a subquery's value is known only while the query runs, so every partition would be searched).
   */
  async recentReadings(
    sensorId: number,
    days: number,
  ): Promise<{ at: Date; airTemperatureC: number; relativeHumidityPct: number; surfaceTemperatureC: number | null }[]> {
    const [newest] = (await this.dataSource.query("SELECT MAX(taken_at) AS at FROM sensor_readings WHERE sensor_id = ?", [
      sensorId,
    ])) as { at: Date | null }[];
    if (!newest?.at) return [];
    const to = new Date(newest.at);
    const rows: { at: Date; airT: string | number; rh: string | number; surfaceT: string | number | null }[] =
      await this.dataSource.query(
        `SELECT r.taken_at AS at, r.air_temperature_c AS airT, r.relative_humidity_pct AS rh, r.surface_temperature_c AS surfaceT
           FROM sensor_readings r
          WHERE r.sensor_id = ? AND r.taken_at >= ? AND r.taken_at <= ?
          ORDER BY r.taken_at`,
        [sensorId, new Date(to.getTime() - days * DAY_MS), to],
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
   * Checks and stores a batch of JSON readings (an HTTP body's or an MQTT payload's) for one sensor.
   * Each reading is stored, a duplicate of one stored before (same sensor and second: the first value
   * stays), or refused with its reason; one transaction for all of it, then the listeners are told. The
   * sensor is read again here, so one revoked or removed after it was identified stores nothing.
   */
  async ingest(sensor: SensorIdentity, readings: unknown[], via: "http" | "mqtt"): Promise<IngestOutcome> {
    return this.run(sensor, readings.length, via, (limits) => checkJsonReadings(readings, limits));
  }

  /** The same for a CSV body (readings-csv.ts): a header it cannot read is a 400 and stores nothing. */
  async ingestCsv(sensor: SensorIdentity, body: Buffer): Promise<IngestOutcome> {
    return this.run(sensor, 0, "http", (limits) => checkCsvReadings(body, limits));
  }

  private async run(
    sensor: SensorIdentity,
    sent: number,
    via: "http" | "mqtt",
    check: (limits: ReadingLimits) => CheckedBatch | Promise<CheckedBatch>,
  ): Promise<IngestOutcome> {
    this.inFlight++;
    if (this.quietTimer) {
      clearTimeout(this.quietTimer);
      this.quietTimer = null;
    }
    try {
      return await this.checkAndStore(sensor, sent, via, check);
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

  private async checkAndStore(
    sensor: SensorIdentity,
    sent: number,
    via: "http" | "mqtt",
    check: (limits: ReadingLimits) => CheckedBatch | Promise<CheckedBatch>,
  ): Promise<IngestOutcome> {
    const window = await this.windowOf(sensor.id);
    const receivedAt = this.clock.now();
    const nowMs = receivedAt.getTime();
    const limits: ReadingLimits = {
      window: window ?? { fromMs: 0, toMs: 0, active: false },
      latestMs: nowMs + FUTURE_TOLERANCE_MS,
      earliestMs: nowMs - SENSOR_LATE_LIMIT_DAYS * DAY_MS,
    };
    const batch = await check(limits);
    if (!window?.active) {
      // Every reading is refused; the batch was still read, so a CSV's readings are counted and named.
      const inactive = "This sensor is no longer active (revoked or removed).";
      const total = Math.max(sent, batch.count + batch.refused.length);
      const byIndex = new Map(batch.refused.map((r) => [r.index, r.takenAt]));
      const refused = Array.from({ length: total }, (_, index) => ({
        index,
        takenAt: byIndex.get(index) ?? null,
        reason: inactive,
      }));
      return { stored: 0, duplicates: 0, refused };
    }

    let stored = 0;
    if (batch.count > 0)
      stored = await this.load(sensor.id, batch.rows, batch.count, sqlDateTime(batch.newestMs, ""), sqlDateTimeMs(receivedAt));
    const outcome: IngestOutcome = { stored, duplicates: batch.count - stored, refused: batch.refused };
    if (stored > 0) {
      const backfill = nowMs - batch.newestMs > BACKFILL_AGE_MS;
      if (backfill && (this.inFlight > 1 || this.untold.size > 0)) this.holdBackfill(sensor, batch.newestMs, receivedAt);
      else this.notify(sensor, new Date(batch.newestMs), receivedAt);
    }
    if (batch.refused.length > 0) {
      this.logger?.debug(
        { sensorId: sensor.id, via, refused: batch.refused.length, first: batch.refused[0] },
        "sensor readings refused",
      );
    }
    return outcome;
  }

  /**
   * One transaction: the rows through LOAD DATA LOCAL from memory (the stream technique of the stock
   * import; MariaDB takes it several times faster than the same rows as INSERT … VALUES), duplicates
   * skipped by IGNORE and counted from the affected rows, then last_reading_at moved forward. A bulk
   * batch waits for its turn before it takes a connection (so waiting batches hold none), and gives the
   * turn up once its rows are in: the next one loads while this one commits.
   */
  private async load(sensorId: number, rows: Buffer, count: number, newest: string, received: string): Promise<number> {
    const loadRows = async () => {
      const runner = this.dataSource.createQueryRunner();
      try {
        const db = ((await runner.connect()) as PoolConnection).promise();
        await runner.startTransaction();
        const [loaded] = await db.query<ResultSetHeader>({
          sql: loadSql(sensorId, received),
          infileStreamFactory: () => Readable.from(chunks(rows)),
        });
        return { runner, db, inserted: loaded.affectedRows };
      } catch (err) {
        if (runner.isTransactionActive) await runner.rollbackTransaction().catch(() => undefined);
        await runner.release();
        throw err;
      }
    };
    const { runner, db, inserted } = count < BULK_ROWS ? await loadRows() : await this.bulkLoads(loadRows);
    try {
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
      await runner.rollbackTransaction().catch(() => undefined);
      throw err;
    } finally {
      await runner.release();
    }
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
