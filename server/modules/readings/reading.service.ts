// Readings of a case: typed in by hand, listed, and handed to the risk engine as a series.
import type { DataSource, EntityManager } from "typeorm";
import type { SeriesReading } from "../../../src/lib/domain/series.js";
import { FUTURE_READING_MESSAGE, isFutureReading } from "../../../src/lib/schemas/readings.js";
import type { Clock } from "../../lib/clock.js";
import { ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { inTransaction } from "../../lib/transaction.js";
import type { NewCaseEvent } from "../cases/case-events.js";
import { AIR_TEMPERATURE_C, OUTDOOR_TEMPERATURE_C, RELATIVE_HUMIDITY_PCT, SURFACE_TEMPERATURE_C } from "./csv/limits.js";
import { round2 } from "./csv/numbers.js";
import { toSqlUtc } from "./csv/rows.js";
import type { ReadingSource } from "./reading.entity.js";
import type { RoomEvaluationInput, StoredRoomEvaluation } from "./room-evaluation.task.js";

export type { StoredRoomEvaluation } from "./room-evaluation.task.js";

const HOUR_MS = 3_600_000;

/** Works one room's evaluation out from the database: on the worker pool in the app (createServices). */
export type RoomEvaluator = (input: RoomEvaluationInput) => Promise<{ version: number; evaluation: StoredRoomEvaluation }>;

/** How rooms are worked out again off the request thread, and who hears of it (wired in createServices). */
export interface RoomEvaluationWork {
  /** Works one room out from the database (the worker pool in the app). */
  evaluator: RoomEvaluator;
  /** Where a recomputation that failed with nobody waiting for it is reported. */
  logger: Pick<Logger, "error">;
  /**
   * Called inside the transaction that stores a room's newer evaluation over an older one: figures
   * stored elsewhere from the older one (the case's triage figures) are due to be worked out again.
   */
  onReplaced(m: EntityManager, caseId: number): Promise<void>;
  /**
   * Outdoor air by the hour at a place (the weather module's WeatherService.hoursAt), for readings that
   * carry no outdoor temperature; missing hours are left out. Without it, such readings stay without.
   */
  outdoorHours?(
    place: { latitude: number; longitude: number },
    from: Date,
    to: Date,
  ): Promise<{ at: Date; temperatureC: number; relativeHumidityPct: number }[]>;
}

/** A room's evaluation as answered: the stored one, and whether it is being brought up to date with newer readings. */
export interface RoomEvaluationState {
  evaluation: StoredRoomEvaluation;
  /** True while newer readings are being taken in: `evaluation` is the last stored one. */
  updating: boolean;
  /** When `evaluation` was worked out (the app's clock). */
  evaluatedAt: Date | null;
}

interface StoredRow {
  room_id: number;
  readings_version: number;
  computed_version: number | null;
  params: string | null;
  result: string | null;
  computed_at: Date | null;
}

/** A new weather place (a home given coordinates) makes the stored result out of date, as a new element does. */
const paramsKey = (params: EvaluationParams): string =>
  `${params.element ?? ""}|${params.surfaceWet ? "wet" : "dry"}` +
  (params.weather ? `|wx:${params.weather.latitude.toFixed(1)},${params.weather.longitude.toFixed(1)}` : "");

/**
 * What a room's stored evaluation was worked out for: the case's main element, whether a surface is
 * wet, and where the outdoor weather comes from for readings without an outdoor temperature (none:
 * such readings have no outdoor values).
 */
export interface EvaluationParams {
  element?: RoomEvaluationInput["element"];
  surfaceWet: boolean;
  weather?: { latitude: number; longitude: number };
}

export interface ManualReading {
  roomId: number;
  takenAt: Date;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC?: number;
  outdoorTemperatureC?: number;
}

export interface ReadingView {
  id: number;
  roomId: number;
  /** UTC, whole seconds. */
  takenAt: Date;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  outdoorTemperatureC: number | null;
  source: ReadingSource;
  importId: number | null;
}

/** A reading as the risk engine takes it, with the time as a Date. */
export type SeriesPoint = SeriesReading & { at: Date };

/** Most readings list() returns when no limit is given. */
export const DEFAULT_LIST_LIMIT = 100_000;
const INSERT_CHUNK = 1_000;

interface ReadingRow {
  id: string;
  room_id: number;
  taken_at: Date;
  air_temperature_c: string;
  relative_humidity_pct: string;
  surface_temperature_c: string | null;
  outdoor_temperature_c: string | null;
  source: ReadingSource;
  import_id: number | null;
}

const num = (v: string | null): number | null => (v === null ? null : Number(v));

const toReadingView = (r: ReadingRow): ReadingView => ({
  id: Number(r.id),
  roomId: r.room_id,
  takenAt: r.taken_at,
  airTemperatureC: Number(r.air_temperature_c),
  relativeHumidityPct: Number(r.relative_humidity_pct),
  surfaceTemperatureC: num(r.surface_temperature_c),
  outdoorTemperatureC: num(r.outdoor_temperature_c),
  source: r.source,
  importId: r.import_id,
});

function checkManual(readings: readonly ManualReading[], nowMs: number): void {
  const details: { field: string; message: string }[] = [];
  const range = (i: number, field: string, v: number | undefined, r: { min: number; max: number }, required: boolean) => {
    if (v === undefined || v === null) {
      if (required) details.push({ field: `${i}.${field}`, message: `${field} is required.` });
    } else if (!Number.isFinite(v) || v < r.min || v > r.max) {
      details.push({ field: `${i}.${field}`, message: `${field} must be between ${r.min} and ${r.max} °C.` });
    }
  };
  readings.forEach((r, i) => {
    if (!Number.isInteger(r.roomId) || r.roomId <= 0)
      details.push({ field: `${i}.roomId`, message: "roomId must be a room of this home." });
    if (!(r.takenAt instanceof Date) || Number.isNaN(r.takenAt.getTime()))
      details.push({ field: `${i}.takenAt`, message: "takenAt must be a date and time." });
    else if (isFutureReading(r.takenAt.getTime(), nowMs))
      details.push({ field: `${i}.takenAt`, message: `takenAt: ${FUTURE_READING_MESSAGE}` });
    range(i, "airTemperatureC", r.airTemperatureC, AIR_TEMPERATURE_C, true);
    range(i, "surfaceTemperatureC", r.surfaceTemperatureC, SURFACE_TEMPERATURE_C, false);
    range(i, "outdoorTemperatureC", r.outdoorTemperatureC, OUTDOOR_TEMPERATURE_C, false);
    const rh = r.relativeHumidityPct;
    if (!Number.isFinite(rh) || rh <= RELATIVE_HUMIDITY_PCT.above || rh > RELATIVE_HUMIDITY_PCT.max) {
      details.push({ field: `${i}.relativeHumidityPct`, message: "relativeHumidityPct must be more than 0 and at most 100 %." });
    }
  });
  if (details.length > 0) throw new ValidationError(`${details[0].field}: ${details[0].message}`, details);
}

/** Writes the case timeline entry inside the readings' own transaction (CaseService does). */
export interface CaseEventRecorder {
  recordEvent(m: EntityManager, e: NewCaseEvent): Promise<void>;
}

export class ReadingService {
  /** Recomputations running now, by case, room and params: one per room at a time, joined by later callers. */
  private readonly running = new Map<string, Promise<StoredRoomEvaluation>>();
  /** refreshInBackground calls still finding out which rooms to work out again. */
  private readonly starting = new Set<Promise<void>>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly events: CaseEventRecorder,
    private readonly clock: Clock,
    private readonly work: RoomEvaluationWork,
  ) {}

  /**
   * Marks the stored evaluations of these rooms out of date, inside the transaction that changed
   * their readings (every writer of readings calls it, last, so the row lock is held briefly).
   */
  async markChanged(m: EntityManager, caseId: number, roomIds: readonly number[]): Promise<void> {
    const rooms = [...new Set(roomIds)].sort((a, b) => a - b);
    if (rooms.length === 0) return;
    await m.query(
      "INSERT INTO room_evaluations (case_id, room_id, readings_version) VALUES " +
        rooms.map(() => "(?, ?, 1)").join(", ") +
        " ON DUPLICATE KEY UPDATE readings_version = readings_version + 1",
      rooms.flatMap((roomId) => [caseId, roomId]),
    );
  }

  /**
   * The evaluation of each of these rooms: the stored one while it is current. When readings changed
   * since, the last stored result is answered at once, marked `updating`, and the room is worked out
   * again in the background (on the worker pool); only a room with no stored result yet is waited for.
   */
  async roomEvaluations(
    caseId: number,
    roomIds: readonly number[],
    params: EvaluationParams,
  ): Promise<Map<number, RoomEvaluationState>> {
    const out = new Map<number, RoomEvaluationState>();
    if (roomIds.length === 0) return out;
    const key = paramsKey(params);
    const rows = await this.storedRows(caseId, roomIds);
    await Promise.all(
      roomIds.map(async (roomId) => {
        const row = rows.get(roomId);
        if (row && row.result !== null) {
          const current = row.computed_version === row.readings_version && row.params === key;
          if (!current) this.refresh(caseId, roomId, params).catch((err: unknown) => this.logFailure(err, caseId, roomId));
          out.set(roomId, {
            evaluation: JSON.parse(row.result) as StoredRoomEvaluation,
            updating: !current,
            evaluatedAt: row.computed_at,
          });
          return;
        }
        const evaluation = await this.refresh(caseId, roomId, params);
        out.set(roomId, { evaluation, updating: false, evaluatedAt: this.clock.now() });
      }),
    );
    return out;
  }

  /** Starts bringing these rooms' stored evaluations up to date without waiting (after readings were added). */
  refreshInBackground(caseId: number, roomIds: readonly number[], params: EvaluationParams): void {
    const key = paramsKey(params);
    const started = this.storedRows(caseId, roomIds)
      .then((rows) => {
        for (const roomId of roomIds) {
          const row = rows.get(roomId);
          if (row && row.result !== null && row.computed_version === row.readings_version && row.params === key) continue;
          this.refresh(caseId, roomId, params).catch((err: unknown) => this.logFailure(err, caseId, roomId));
        }
      })
      .catch((err: unknown) => this.logFailure(err, caseId))
      .finally(() => this.starting.delete(started));
    this.starting.add(started);
  }

  /** A recomputation nobody waits for failed: the last stored result stays (marked updating) until the next view tries again. */
  private logFailure(err: unknown, caseId: number, roomId?: number): void {
    this.work.logger.error({ err, caseId, roomId }, "a room's evaluation could not be worked out again");
  }

  /** Resolves once no recomputation is starting or running (each one has finished, stored or not). */
  async whenIdle(): Promise<void> {
    while (this.starting.size > 0 || this.running.size > 0)
      await Promise.allSettled([...this.starting, ...this.running.values()]);
  }

  private async storedRows(caseId: number, roomIds: readonly number[]): Promise<Map<number, StoredRow>> {
    if (roomIds.length === 0) return new Map();
    const rows: StoredRow[] = await this.dataSource.query(
      `SELECT room_id, readings_version, computed_version, params, result, computed_at FROM room_evaluations WHERE case_id = ? AND room_id IN (${roomIds.map(() => "?").join(",")})`,
      [caseId, ...roomIds],
    );
    return new Map(rows.map((r) => [r.room_id, r]));
  }

  /**
   * Works a room out again and stores it, one recomputation per room at a time: a caller while one
   * runs joins it. When the readings changed while it ran (its save is refused by the version
   * guard), it runs again, so the stored result catches up with the newest readings.
   */
  private refresh(caseId: number, roomId: number, params: EvaluationParams): Promise<StoredRoomEvaluation> {
    const key = paramsKey(params);
    const id = `${caseId}:${roomId}:${key}`;
    const running = this.running.get(id);
    if (running) return running;
    const work = (async () => {
      for (;;) {
        const { evaluation, stored } = await this.recomputeOnce(caseId, roomId, params, key);
        if (stored) return evaluation;
      }
    })().finally(() => this.running.delete(id));
    this.running.set(id, work);
    return work;
  }

  private async recomputeOnce(
    caseId: number,
    roomId: number,
    params: EvaluationParams,
    key: string,
  ): Promise<{ evaluation: StoredRoomEvaluation; stored: boolean }> {
    const { version, evaluation } = await this.work.evaluator({
      db: dbOf(this.dataSource),
      caseId,
      roomId,
      element: params.element,
      surfaceWet: params.surfaceWet,
      outdoorHours: params.weather ? await this.outdoorHoursFor(caseId, roomId, params.weather) : undefined,
    });
    const json = JSON.stringify(evaluation);
    const now = this.clock.now();
    // Stored only if the readings did not change while it was worked out (the version still matches).
    // The room's row is locked before the case's (as when readings are added), and a result that
    // replaces an older one tells the listener in the same transaction.
    const stored = await inTransaction(this.dataSource, async (m) => {
      const [row] = (await m.query(
        "SELECT readings_version, result IS NOT NULL AS replaces FROM room_evaluations WHERE case_id = ? AND room_id = ? FOR UPDATE",
        [caseId, roomId],
      )) as { readings_version: number; replaces: number | string }[];
      if (row && Number(row.readings_version) !== version) return false;
      await m.query(
        "INSERT INTO room_evaluations (case_id, room_id, readings_version, computed_version, params, result, computed_at) VALUES (?, ?, ?, ?, ?, ?, ?) " +
          "ON DUPLICATE KEY UPDATE computed_version = VALUES(computed_version), params = VALUES(params), result = VALUES(result), computed_at = VALUES(computed_at)",
        [caseId, roomId, version, version, key, json, now],
      );
      if (row && Number(row.replaces) === 1) await this.work.onReplaced(m, caseId);
      return true;
    });
    return { evaluation, stored };
  }

  /**
   * The weather's hours over the room's readings that have no outdoor temperature, for the worker (as
   * arrays by hour from the first, so the message stays small). Null when every reading has one.
   */
  private async outdoorHoursFor(
    caseId: number,
    roomId: number,
    place: { latitude: number; longitude: number },
  ): Promise<RoomEvaluationInput["outdoorHours"]> {
    if (!this.work.outdoorHours) return undefined;
    const [span] = (await this.dataSource.query(
      "SELECT MIN(taken_at) AS first, MAX(taken_at) AS last FROM readings WHERE case_id = ? AND room_id = ? AND outdoor_temperature_c IS NULL",
      [caseId, roomId],
    )) as { first: Date | null; last: Date | null }[];
    if (!span?.first || !span.last) return undefined;
    const hours = await this.work.outdoorHours(place, span.first, span.last);
    if (hours.length === 0) return undefined;
    const startMs = hours[0]!.at.getTime();
    const length = Math.round((hours.at(-1)!.at.getTime() - startMs) / HOUR_MS) + 1;
    const temperatureC: (number | null)[] = new Array<number | null>(length).fill(null);
    const relativeHumidityPct: (number | null)[] = new Array<number | null>(length).fill(null);
    for (const h of hours) {
      const i = Math.round((h.at.getTime() - startMs) / HOUR_MS);
      temperatureC[i] = h.temperatureC;
      relativeHumidityPct[i] = h.relativeHumidityPct;
    }
    return { startMs, temperatureC, relativeHumidityPct };
  }

  /** The latest reading of each of these rooms (the unique index's last entry per room; no series is read). */
  async latestPerRoom(caseId: number, roomIds: readonly number[]): Promise<Map<number, SeriesPoint>> {
    const out = new Map<number, SeriesPoint>();
    for (const roomId of roomIds) {
      const rows: Pick<
        ReadingRow,
        "taken_at" | "air_temperature_c" | "relative_humidity_pct" | "surface_temperature_c" | "outdoor_temperature_c"
      >[] = await this.dataSource.query(
        "SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c FROM readings WHERE case_id = ? AND room_id = ? ORDER BY taken_at DESC LIMIT 1",
        [caseId, roomId],
      );
      const r = rows[0];
      if (!r) continue;
      const reading: SeriesPoint = {
        at: r.taken_at,
        airTemperatureC: Number(r.air_temperature_c),
        relativeHumidityPct: Number(r.relative_humidity_pct),
      };
      if (r.surface_temperature_c !== null) reading.surfaceTemperatureC = Number(r.surface_temperature_c);
      if (r.outdoor_temperature_c !== null) reading.outdoorTemperatureC = Number(r.outdoor_temperature_c);
      out.set(roomId, reading);
    }
    return out;
  }

  /**
   * Adds readings typed in by hand, in one transaction. A reading at a time the room already has
   * (to the second) is skipped and counted as a duplicate, as with imports.
   * The case's timeline records who added them, in the same transaction.
   */
  async addManual(
    caseId: number,
    readings: readonly ManualReading[],
    options: { actorId: number },
  ): Promise<{ imported: number; duplicates: number }> {
    checkManual(readings, this.clock.now().getTime());
    if (readings.length === 0) return { imported: 0, duplicates: 0 };
    return this.dataSource.transaction(async (m) => {
      let imported = 0;
      for (let start = 0; start < readings.length; start += INSERT_CHUNK) {
        const chunk = readings.slice(start, start + INSERT_CHUNK);
        const params: unknown[] = [];
        for (const r of chunk) {
          params.push(
            caseId,
            r.roomId,
            toSqlUtc(Math.floor(r.takenAt.getTime() / 1000) * 1000),
            round2(r.airTemperatureC),
            round2(r.relativeHumidityPct),
            r.surfaceTemperatureC === undefined || r.surfaceTemperatureC === null ? null : round2(r.surfaceTemperatureC),
            r.outdoorTemperatureC === undefined || r.outdoorTemperatureC === null ? null : round2(r.outdoorTemperatureC),
          );
        }
        const values = chunk.map(() => "(?,?,?,?,?,?,?,'manual',NULL)").join(",");
        const result: { affectedRows: number } = await m.query(
          "INSERT IGNORE INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id) VALUES " +
            values,
          params,
        );
        imported += result.affectedRows;
      }
      const duplicates = readings.length - imported;
      const roomIds = [...new Set(readings.map((r) => r.roomId))];
      if (imported > 0) await this.markChanged(m, caseId, roomIds);
      await this.events.recordEvent(m, {
        caseId,
        actorId: options.actorId,
        type: "readings-added",
        after: { imported, duplicates, roomIds, roomId: roomIds[0] },
      });
      return { imported, duplicates };
    });
  }

  /** How many readings the case has taken at or after `since` (inside the caller's transaction when given one). */
  async countSince(caseId: number, since: Date, m: EntityManager = this.dataSource.manager): Promise<number> {
    return Number(
      (await m.query("SELECT COUNT(*) AS n FROM readings WHERE case_id = ? AND taken_at >= ?", [caseId, since]))[0]?.n ?? 0,
    );
  }

  /** Readings of a case (one room, or all), oldest first; at most `limit` (the oldest ones, or with `newest` the latest). */
  async list(caseId: number, opts: { roomId?: number; limit?: number; newest?: boolean } = {}): Promise<ReadingView[]> {
    const limit = Math.max(1, Math.min(opts.limit ?? DEFAULT_LIST_LIMIT, 1_000_000));
    const select =
      "SELECT id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id " +
      `FROM readings WHERE case_id = ?${opts.roomId === undefined ? "" : " AND room_id = ?"}`;
    // newest: the latest `limit` readings (what a chart wants), still returned oldest first.
    const sql = opts.newest
      ? `SELECT * FROM (${select} ORDER BY taken_at DESC, room_id DESC, id DESC LIMIT ?) latest ORDER BY taken_at, room_id, id`
      : `${select} ORDER BY taken_at, room_id, id LIMIT ?`;
    const rows: ReadingRow[] = await this.dataSource.query(
      sql,
      opts.roomId === undefined ? [caseId, limit] : [caseId, opts.roomId, limit],
    );
    return rows.map(toReadingView);
  }

  /**
   * The next `limit` readings of a case (one room, or all) after `after`, oldest first in the order
   * of list(): by time, then room (a room has one reading per second, so time and room are a key).
   * For exports, which read a case's readings a page at a time.
   */
  async listAfter(
    caseId: number,
    opts: { roomId?: number; after?: Pick<ReadingView, "takenAt" | "roomId">; limit: number },
  ): Promise<ReadingView[]> {
    const where = ["case_id = ?"];
    const params: unknown[] = [caseId];
    if (opts.roomId !== undefined) {
      where.push("room_id = ?");
      params.push(opts.roomId);
    }
    if (opts.after) {
      // The redundant taken_at >= ? lets MariaDB start its index range there rather than at the case's first reading.
      where.push("taken_at >= ? AND (taken_at > ? OR (taken_at = ? AND room_id > ?))");
      params.push(opts.after.takenAt, opts.after.takenAt, opts.after.takenAt, opts.after.roomId);
    }
    const rows: ReadingRow[] = await this.dataSource.query(
      "SELECT id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id " +
        `FROM readings WHERE ${where.join(" AND ")} ORDER BY taken_at, room_id LIMIT ?`,
      [...params, opts.limit],
    );
    return rows.map(toReadingView);
  }

  /** A case's readings (one room, or all) oldest first, shaped for the risk engine's evaluateSeries. */
  async seriesFor(caseId: number, roomId?: number): Promise<SeriesPoint[]> {
    const rows: Pick<
      ReadingRow,
      "taken_at" | "air_temperature_c" | "relative_humidity_pct" | "surface_temperature_c" | "outdoor_temperature_c"
    >[] = await this.dataSource.query(
      "SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c " +
        `FROM readings WHERE case_id = ?${roomId === undefined ? "" : " AND room_id = ?"} ORDER BY taken_at, room_id, id`,
      roomId === undefined ? [caseId] : [caseId, roomId],
    );
    return rows.map((r) => {
      const reading: SeriesPoint = {
        at: r.taken_at,
        airTemperatureC: Number(r.air_temperature_c),
        relativeHumidityPct: Number(r.relative_humidity_pct),
      };
      if (r.surface_temperature_c !== null) reading.surfaceTemperatureC = Number(r.surface_temperature_c);
      if (r.outdoor_temperature_c !== null) reading.outdoorTemperatureC = Number(r.outdoor_temperature_c);
      return reading;
    });
  }

  /** How many readings were taken in a room of a home, over all its cases (inside the caller's transaction). */
  async readingsInRoom(propertyId: number, roomId: number, m: EntityManager = this.dataSource.manager): Promise<number> {
    const rows: { n: string | number }[] = await m.query(
      "SELECT COUNT(*) AS n FROM readings WHERE room_id = ? AND case_id IN (SELECT id FROM cases WHERE property_id = ?)",
      [roomId, propertyId],
    );
    return Number(rows[0]?.n ?? 0);
  }

  /** Each room's reading count and its latest `perRoom` readings over all the cases of a home, newest first. */
  async latestByRoom(
    propertyId: number,
    perRoom: number,
  ): Promise<
    {
      roomId: number;
      count: number;
      latest: (Pick<ReadingView, "takenAt" | "airTemperatureC" | "relativeHumidityPct" | "surfaceTemperatureC"> & {
        caseId: number;
      })[];
    }[]
  > {
    const rows: {
      case_id: number;
      room_id: number;
      taken_at: Date;
      air_temperature_c: string;
      relative_humidity_pct: string;
      surface_temperature_c: string | null;
      n: string | number;
    }[] = await this.dataSource.query(
      "SELECT case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, n FROM (" +
        "SELECT r.case_id, r.room_id, r.taken_at, r.air_temperature_c, r.relative_humidity_pct, r.surface_temperature_c, " +
        "ROW_NUMBER() OVER (PARTITION BY r.room_id ORDER BY r.taken_at DESC, r.id DESC) AS rn, COUNT(*) OVER (PARTITION BY r.room_id) AS n " +
        "FROM readings r WHERE r.case_id IN (SELECT id FROM cases WHERE property_id = ?)) x WHERE rn <= ? ORDER BY room_id, taken_at DESC",
      [propertyId, perRoom],
    );
    const byRoom = new Map<
      number,
      {
        roomId: number;
        count: number;
        latest: {
          caseId: number;
          takenAt: Date;
          airTemperatureC: number;
          relativeHumidityPct: number;
          surfaceTemperatureC: number | null;
        }[];
      }
    >();
    for (const r of rows) {
      let room = byRoom.get(r.room_id);
      if (!room) byRoom.set(r.room_id, (room = { roomId: r.room_id, count: Number(r.n), latest: [] }));
      room.latest.push({
        caseId: r.case_id,
        takenAt: r.taken_at,
        airTemperatureC: Number(r.air_temperature_c),
        relativeHumidityPct: Number(r.relative_humidity_pct),
        surfaceTemperatureC: num(r.surface_temperature_c),
      });
    }
    return [...byRoom.values()];
  }
}

/** The connection settings of the app's data source, for a worker's own connection. */
function dbOf(dataSource: DataSource): RoomEvaluationInput["db"] {
  const o = dataSource.options as { host?: string; port?: number; username?: string; password?: string; database?: string };
  return {
    host: o.host ?? "127.0.0.1",
    port: o.port ?? 3306,
    user: o.username ?? "",
    password: o.password ?? "",
    name: o.database ?? "",
  };
}
