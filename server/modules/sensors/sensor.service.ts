// The sensor registry: leads (admin, maintenance) register sensors in rooms of their landlord's homes,
// edit them (version-checked), mark them removed, and issue, rotate or revoke their one secret. Staff of
// the landlord read them and their readings. Other landlords' sensors are invisible (404).
import { randomBytes } from "node:crypto";
import { QueryFailedError, type DataSource, type EntityManager } from "typeorm";
import type { SensorCreateInput, SensorPatchInput, SensorRemoveInput, SensorState } from "../../../src/lib/schemas/sensors.js";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { inTransaction } from "../../lib/transaction.js";
import type { Property } from "../properties/property.service.js";
import { mosquittoPasswordHash, newSensorSecret, sensorKeyHash } from "./credentials.js";
import type { BrokerCredentials } from "./sensor-events.js";
import { SensorReading } from "./sensor-reading.entity.js";
import { Sensor } from "./sensor.entity.js";

export type { Sensor } from "./sensor.entity.js";

/** What the registry needs of the properties module: a home of the actor's landlord with its rooms (404 otherwise). */
export interface SensorHomes {
  getForStaff(actor: Actor, id: number): Promise<Property>;
}

/** A sensor with the names lists show beside it. */
export interface SensorView {
  sensor: Sensor;
  homeAddress: string;
  roomName: string;
}

export interface SensorListQuery {
  propertyId?: number | undefined;
  state?: SensorState | undefined;
  page: number;
  pageSize: number;
}

/** One entry of the broker's password file: only sensors that may connect (issued, not revoked, not removed). */
export interface BrokerEntry {
  sensorId: number;
  mqttUsername: string;
  mqttPasswordHash: string;
}

export interface SensorSeriesPoint {
  takenAt: Date;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  batteryPct: number | null;
}

/** The longest window one series request may cover, and how many points it returns at most before averaging. */
export const SERIES_MAX_DAYS = 366;
export const SERIES_MAX_POINTS = 2000;

const LEAD_ROLES = ["admin", "maintenance"] as const;
const noBroker: BrokerCredentials = { credentialsChanged: async () => undefined };

export const mqttTopicOf = (mqttUsername: string) => `sensors/${mqttUsername}/readings`;

export function stateOf(s: Pick<Sensor, "removedOn" | "revokedAt" | "keyHash">): SensorState {
  if (s.removedOn) return "removed";
  if (s.revokedAt || !s.keyHash) return "revoked";
  return "active";
}

const isDuplicate = (error: unknown) =>
  error instanceof QueryFailedError && (error.driverError as { errno?: number } | undefined)?.errno === 1062;

const serialTaken = (serial: string) =>
  new ConflictError(`Another of your sensors already has the serial number ${serial}.`, [
    { field: "serial", message: "Another of your sensors already has this serial number." },
  ]);

export class SensorService {
  private broker: BrokerCredentials = noBroker;

  constructor(
    private readonly dataSource: DataSource,
    private readonly homes: SensorHomes,
    private readonly clock: Clock,
    private readonly logger?: Logger,
  ) {}

  /** The broker's files follow each change of credentials (the mqtt module; a no-op until it is wired). */
  useBroker(broker: BrokerCredentials): void {
    this.broker = broker;
  }

  private requireLead(actor: Actor): void {
    if (!(LEAD_ROLES as readonly string[]).includes(actor.role)) {
      throw new ForbiddenError("Only an administrator or a maintenance lead may change sensors.", "role_not_allowed");
    }
  }

  private audit(actor: Actor, action: string, details: Record<string, unknown>) {
    this.logger?.info({ audit: action, actorId: actor.id, organisationId: actor.organisationId, ...details }, `audit: ${action}`);
  }

  /** After the commit: the broker reloads its files. It never throws; a failure is logged and the next change retries. */
  private async tellBroker(): Promise<void> {
    try {
      await this.broker.credentialsChanged();
    } catch (err) {
      this.logger?.error({ err }, "the MQTT broker's credentials could not be brought up to date");
    }
  }

  /** The home (of the actor's landlord) and the room in it; 404 / 400 otherwise. */
  private async placeOf(actor: Actor, propertyId: number, roomId: number) {
    const home = await this.homes.getForStaff(actor, propertyId);
    const room = home.rooms?.find((r) => r.id === roomId);
    if (!room) {
      throw new ValidationError("That room is not in this home.", [{ field: "roomId", message: "Choose a room of this home." }]);
    }
    return { home, room };
  }

  private async view(actor: Actor, sensor: Sensor): Promise<SensorView> {
    return (await this.views(actor, [sensor]))[0]!;
  }

  private async views(actor: Actor, sensors: Sensor[]): Promise<SensorView[]> {
    const homes = new Map<number, Property>();
    await Promise.all(
      [...new Set(sensors.map((s) => s.propertyId))].map(async (id) => {
        homes.set(id, await this.homes.getForStaff(actor, id));
      }),
    );
    return sensors.map((sensor) => {
      const home = homes.get(sensor.propertyId);
      return {
        sensor,
        homeAddress: home?.addressLine1 ?? "",
        roomName: home?.rooms?.find((r) => r.id === sensor.roomId)?.name ?? "",
      };
    });
  }

  private today(): string {
    return localDate(this.clock.now());
  }

  private checkDates(installedOn: string, removedOn: string | null) {
    const today = this.today();
    if (installedOn > today) {
      throw new ValidationError("The installation date cannot be in the future.", [
        { field: "installedOn", message: "Give the day it was fitted (today or earlier)." },
      ]);
    }
    if (removedOn !== null && removedOn < installedOn) {
      throw new ValidationError("It cannot be removed before it was installed.", [
        { field: "removedOn", message: "Give a day on or after the installation date." },
      ]);
    }
    if (removedOn !== null && removedOn > today) {
      throw new ValidationError("The removal date cannot be in the future.", [
        { field: "removedOn", message: "Give the day it was taken out (today or earlier)." },
      ]);
    }
  }

  private async locked(m: EntityManager, actor: Actor, id: number): Promise<Sensor> {
    const sensor = await m
      .getRepository(Sensor)
      .findOne({ where: { id, organisationId: actor.organisationId }, lock: { mode: "pessimistic_write" } });
    if (!sensor) throw new NotFoundError("No such sensor.");
    return sensor;
  }

  private issueInto(sensor: Sensor): string {
    const secret = newSensorSecret();
    sensor.keyHash = sensorKeyHash(secret);
    sensor.mqttPasswordHash = mosquittoPasswordHash(secret);
    sensor.keyIssuedAt = this.clock.now();
    sensor.revokedAt = null;
    return secret;
  }

  /** Lead: a new sensor in a room of one of the landlord's homes, with its secret issued at once (in the answer only). */
  async register(actor: Actor, input: SensorCreateInput): Promise<{ view: SensorView; secret: string }> {
    this.requireLead(actor);
    await this.placeOf(actor, input.propertyId, input.roomId);
    this.checkDates(input.installedOn, null);
    let secret = "";
    const sensor = await inTransaction(this.dataSource, async (m) => {
      const repo = m.getRepository(Sensor);
      const fresh = repo.create({
        organisationId: actor.organisationId,
        propertyId: input.propertyId,
        roomId: input.roomId,
        serial: input.serial,
        model: input.model,
        placement: input.placement,
        measuresSurface: input.measuresSurface,
        intervalS: input.intervalS,
        installedOn: input.installedOn,
        removedOn: null,
        // Unique and unknown until the id is: "s" + id, set just below in the same transaction.
        mqttUsername: `new-${randomBytes(12).toString("hex")}`,
        lastReadingAt: null,
      });
      secret = this.issueInto(fresh);
      try {
        await repo.insert(fresh);
      } catch (err) {
        if (isDuplicate(err)) throw serialTaken(input.serial);
        throw err;
      }
      fresh.mqttUsername = `s${fresh.id}`;
      await repo.update({ id: fresh.id }, { mqttUsername: fresh.mqttUsername, version: 1 });
      return repo.findOneByOrFail({ id: fresh.id });
    });
    this.audit(actor, "sensor-registered", { sensorId: sensor.id, serial: sensor.serial, roomId: sensor.roomId });
    await this.tellBroker();
    return { view: await this.view(actor, sensor), secret };
  }

  /** Lead: edits the sensor; 409 when someone changed it since the editor's `version`. */
  async update(actor: Actor, id: number, patch: SensorPatchInput): Promise<SensorView> {
    this.requireLead(actor);
    const sensor = await inTransaction(this.dataSource, async (m) => {
      const sensor = await this.locked(m, actor, id);
      if (sensor.version !== patch.version) {
        throw new ConflictError("Someone changed this sensor since you opened it: reload to see their change.", {
          code: "stale_version",
          version: sensor.version,
        });
      }
      const propertyId = patch.propertyId ?? sensor.propertyId;
      const roomId = patch.roomId ?? sensor.roomId;
      if (propertyId !== sensor.propertyId || roomId !== sensor.roomId) await this.placeOf(actor, propertyId, roomId);
      const installedOn = patch.installedOn ?? sensor.installedOn;
      if (patch.installedOn !== undefined) this.checkDates(installedOn, sensor.removedOn);
      const changes: Partial<Sensor> = {
        propertyId,
        roomId,
        serial: patch.serial ?? sensor.serial,
        model: patch.model ?? sensor.model,
        placement: patch.placement ?? sensor.placement,
        measuresSurface: patch.measuresSurface ?? sensor.measuresSurface,
        intervalS: patch.intervalS ?? sensor.intervalS,
        installedOn,
        version: sensor.version + 1,
      };
      try {
        await m.getRepository(Sensor).update({ id }, changes);
      } catch (err) {
        if (isDuplicate(err)) throw serialTaken(changes.serial!);
        throw err;
      }
      return m.getRepository(Sensor).findOneByOrFail({ id });
    });
    this.audit(actor, "sensor-changed", { sensorId: id, fields: Object.keys(patch).filter((k) => k !== "version") });
    return this.view(actor, sensor);
  }

  /** Lead: taken out of the home on `removedOn`: its credentials stop working (kept hashed for the record, not accepted). */
  async remove(actor: Actor, id: number, input: SensorRemoveInput): Promise<SensorView> {
    this.requireLead(actor);
    const sensor = await inTransaction(this.dataSource, async (m) => {
      const sensor = await this.locked(m, actor, id);
      if (sensor.version !== input.version) {
        throw new ConflictError("Someone changed this sensor since you opened it: reload to see their change.", {
          code: "stale_version",
          version: sensor.version,
        });
      }
      this.checkDates(sensor.installedOn, input.removedOn);
      await m.getRepository(Sensor).update({ id }, { removedOn: input.removedOn, version: sensor.version + 1 });
      return m.getRepository(Sensor).findOneByOrFail({ id });
    });
    this.audit(actor, "sensor-removed", { sensorId: id, removedOn: input.removedOn });
    await this.tellBroker();
    return this.view(actor, sensor);
  }

  /** Lead: a new secret (the old one stops working at once); shown in the answer only. 409 for a removed sensor. */
  async issue(actor: Actor, id: number): Promise<{ view: SensorView; secret: string }> {
    this.requireLead(actor);
    let secret = "";
    const sensor = await inTransaction(this.dataSource, async (m) => {
      const sensor = await this.locked(m, actor, id);
      if (sensor.removedOn)
        throw new ConflictError("This sensor has been removed: register it again to use it.", { code: "removed" });
      secret = this.issueInto(sensor);
      await m.getRepository(Sensor).update(
        { id },
        {
          keyHash: sensor.keyHash,
          mqttPasswordHash: sensor.mqttPasswordHash,
          keyIssuedAt: sensor.keyIssuedAt,
          revokedAt: null,
          version: sensor.version + 1,
        },
      );
      return m.getRepository(Sensor).findOneByOrFail({ id });
    });
    this.audit(actor, "sensor-key-issued", { sensorId: id });
    await this.tellBroker();
    return { view: await this.view(actor, sensor), secret };
  }

  /** Lead: the secret stops working at once over HTTP and MQTT; both hashes are cleared. Again is harmless. */
  async revoke(actor: Actor, id: number): Promise<SensorView> {
    this.requireLead(actor);
    const { sensor, changed } = await inTransaction(this.dataSource, async (m) => {
      const sensor = await this.locked(m, actor, id);
      if (!sensor.keyHash && !sensor.mqttPasswordHash) return { sensor, changed: false };
      await m
        .getRepository(Sensor)
        .update({ id }, { keyHash: null, mqttPasswordHash: null, revokedAt: this.clock.now(), version: sensor.version + 1 });
      return { sensor: await m.getRepository(Sensor).findOneByOrFail({ id }), changed: true };
    });
    if (changed) {
      this.audit(actor, "sensor-key-revoked", { sensorId: id });
      await this.tellBroker();
    }
    return this.view(actor, sensor);
  }

  /** Staff of the landlord: one sensor; 404 for another landlord's. */
  async get(actor: Actor, id: number): Promise<SensorView> {
    const sensor = await this.dataSource.getRepository(Sensor).findOneBy({ id, organisationId: actor.organisationId });
    if (!sensor) throw new NotFoundError("No such sensor.");
    return this.view(actor, sensor);
  }

  /** Staff of the landlord: a page of its sensors, newest first, by home and state. */
  async list(actor: Actor, query: SensorListQuery): Promise<{ items: SensorView[]; total: number }> {
    const qb = this.dataSource
      .getRepository(Sensor)
      .createQueryBuilder("s")
      .where("s.organisation_id = :org", { org: actor.organisationId });
    if (query.propertyId !== undefined) qb.andWhere("s.property_id = :propertyId", { propertyId: query.propertyId });
    if (query.state === "removed") qb.andWhere("s.removed_on IS NOT NULL");
    if (query.state === "revoked") qb.andWhere("s.removed_on IS NULL AND s.key_hash IS NULL");
    if (query.state === "active") qb.andWhere("s.removed_on IS NULL AND s.key_hash IS NOT NULL");
    const [sensors, total] = await qb
      .orderBy("s.id", "DESC")
      .skip((query.page - 1) * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items: await this.views(actor, sensors), total };
  }

  /** Staff of the landlord: every sensor ever fitted in one home (404 for another landlord's home). */
  async listForHome(actor: Actor, propertyId: number): Promise<SensorView[]> {
    const home = await this.homes.getForStaff(actor, propertyId);
    const sensors = await this.dataSource
      .getRepository(Sensor)
      .find({ where: { organisationId: actor.organisationId, propertyId }, order: { id: "DESC" } });
    return sensors.map((sensor) => ({
      sensor,
      homeAddress: home.addressLine1,
      roomName: home.rooms?.find((r) => r.id === sensor.roomId)?.name ?? "",
    }));
  }

  /** For the broker's password file: every sensor that may connect now. */
  async brokerEntries(): Promise<BrokerEntry[]> {
    const rows = await this.dataSource
      .getRepository(Sensor)
      .createQueryBuilder("s")
      .select(["s.id", "s.mqttUsername", "s.mqttPasswordHash"])
      .where("s.mqtt_password_hash IS NOT NULL AND s.revoked_at IS NULL AND s.removed_on IS NULL")
      .orderBy("s.id", "ASC")
      .getMany();
    return rows.map((s) => ({ sensorId: s.id, mqttUsername: s.mqttUsername, mqttPasswordHash: s.mqttPasswordHash! }));
  }

  /**
   * Each room of a home with sensor readings since `since`: the mean air temperature and RH of its sensors'
   * readings in that window, and the newest reading's time (the tenant's outlook holds these steady for three
   * days). A plain mean of RH over a day (ours): near enough for a room whose temperature swings a few kelvin.
   */
  async recentByRoom(
    propertyId: number,
    since: Date,
  ): Promise<Map<number, { takenAt: Date; airTemperatureC: number; relativeHumidityPct: number }>> {
    // The home's sensors first: readings joined from sensors are read by sensor alone (a `ref` on the
    // key's first part), i.e. all of each sensor's readings in the partitions left, not just the window;
    // with the ids as constants MariaDB reads the (sensor, time) key from `since` on.
    const ids = (
      (await this.dataSource.query("SELECT id FROM sensors WHERE property_id = ? AND removed_on IS NULL", [propertyId])) as {
        id: number;
      }[]
    ).map((r) => Number(r.id));
    if (ids.length === 0) return new Map();
    const rows = (await this.dataSource.query(
      `SELECT s.room_id AS roomId, MAX(r.taken_at) AS takenAt,
              AVG(r.air_temperature_c) AS air, AVG(r.relative_humidity_pct) AS rh
         FROM sensor_readings r JOIN sensors s ON s.id = r.sensor_id
        WHERE r.sensor_id IN (?) AND r.taken_at >= ?
        GROUP BY s.room_id`,
      [ids, since],
    )) as { roomId: number; takenAt: Date; air: string; rh: string }[];
    return new Map(
      rows.map((r) => [
        Number(r.roomId),
        {
          takenAt: new Date(r.takenAt),
          airTemperatureC: Math.round(Number(r.air) * 10) / 10,
          relativeHumidityPct: Math.round(Number(r.rh) * 10) / 10,
        },
      ]),
    );
  }

  /**
   * Staff of the landlord: the sensor's readings in [from, to), at most SERIES_MAX_DAYS; when there would be
   * more than SERIES_MAX_POINTS, averaged into equal buckets (each point at its bucket's start).
   */
  async series(actor: Actor, id: number, from: Date, to: Date): Promise<{ bucketS: number; points: SensorSeriesPoint[] }> {
    const sensor = await this.dataSource.getRepository(Sensor).findOneBy({ id, organisationId: actor.organisationId });
    if (!sensor) throw new NotFoundError("No such sensor.");
    const spanS = Math.ceil((to.getTime() - from.getTime()) / 1000);
    if (spanS <= 0)
      throw new ValidationError("`from` must be before `to`.", [{ field: "from", message: "Must be before `to`." }]);
    if (spanS > SERIES_MAX_DAYS * 86_400) {
      throw new ValidationError(`A window can be at most ${SERIES_MAX_DAYS} days.`, [
        { field: "to", message: `At most ${SERIES_MAX_DAYS} days after \`from\`.` },
      ]);
    }
    const expected = spanS / Math.max(1, sensor.intervalS);
    const bucketS = expected > SERIES_MAX_POINTS ? Math.ceil(spanS / SERIES_MAX_POINTS) : 0;
    const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
    if (bucketS === 0) {
      const rows = await this.dataSource
        .getRepository(SensorReading)
        .createQueryBuilder("r")
        .where("r.sensor_id = :id AND r.taken_at >= :from AND r.taken_at < :to", { id, from, to })
        .orderBy("r.taken_at", "ASC")
        .limit(SERIES_MAX_POINTS * 2)
        .getMany();
      return {
        bucketS,
        points: rows.map((r) => ({
          takenAt: r.takenAt,
          airTemperatureC: r.airTemperatureC,
          relativeHumidityPct: r.relativeHumidityPct,
          surfaceTemperatureC: r.surfaceTemperatureC,
          batteryPct: r.batteryPct,
        })),
      };
    }
    const rows: { b: string | number; air: string; rh: string; surface: string | null; battery: string | null }[] =
      await this.dataSource.query(
        `SELECT FLOOR(UNIX_TIMESTAMP(taken_at) / ?) AS b, AVG(air_temperature_c) AS air, AVG(relative_humidity_pct) AS rh,
                AVG(surface_temperature_c) AS surface, MIN(battery_pct) AS battery
           FROM sensor_readings WHERE sensor_id = ? AND taken_at >= ? AND taken_at < ?
          GROUP BY b ORDER BY b`,
        [bucketS, id, from, to],
      );
    const round2 = (v: number) => Math.round(v * 100) / 100;
    return {
      bucketS,
      points: rows.map((r) => ({
        takenAt: new Date(Number(r.b) * bucketS * 1000),
        airTemperatureC: round2(Number(r.air)),
        relativeHumidityPct: round2(Number(r.rh)),
        surfaceTemperatureC: r.surface === null ? null : round2(Number(r.surface)),
        batteryPct: num(r.battery),
      })),
    };
  }
}
