import type { DataSource, EntityManager } from "typeorm";
import { OPEN_CASE_STATUSES } from "../../../src/lib/domain/case-workflow.js";
import {
  MOULD_HISTORY_DAYS,
  alertsToRaise,
  sensorElement,
  watchRoom,
  type RoomWatch,
  type RuleHeld,
  type SensorAlertRule,
  type SensorSample,
} from "../../../src/lib/domain/sensor-alerts.js";
import { SURFACE_STATES, type SurfaceState } from "../../../src/lib/domain/surface.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, NotFoundError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { inTransaction } from "../../lib/transaction.js";
import type { Actor } from "../auth/actor.js";
import { addressOf, type Case, type CaseService } from "../cases/case.service.js";
import type { SensorFinding } from "../mail/mail-templates.js";
import type { PolicyService } from "../policy/policy.service.js";
import type { Property, PropertyService } from "../properties/property.service.js";
import type { SensorReadingsListener, StoredReadingsBatch } from "../sensors/sensor-events.js";
import type { SensorIngestService } from "../sensors/sensor-ingest.service.js";
import { SensorAlert } from "./sensor-alert.entity.js";
import { SensorRoomFigures } from "./sensor-room-figures.entity.js";

/** Outdoor hours for a home (the weather module's WeatherService.outdoorHourly; empty without a location). */
export interface OutdoorWeather {
  outdoorHourly(
    propertyId: number,
    from: Date,
    to: Date,
  ): Promise<{ at: Date; temperatureC: number; relativeHumidityPct: number }[]>;
}

/** Who refreshes a case's triage figures at once after its evidence changed (TriageService). */
export interface TriageRefresher {
  refresh(caseId: number): Promise<unknown>;
}

/** A home at risk on the Alerts view: its open alerts with no case, and its rooms' figures. */
export interface HomeAtRisk {
  property: Pick<Property, "id" | "addressLine1" | "town" | "postcode" | "estate">;
  alerts: SensorAlert[];
  rooms: (SensorRoomFigures & { roomName: string })[];
}

export type AlertSort = "raisedAt" | "mouldIndex" | "hoursAt80" | "address";

const RULE_WORDS: Record<SensorAlertRule, string> = {
  "mould-index": "mould growth index",
  "hours-at-80": "hours of damp surface",
  "condensing-days": "days with condensation",
};

const round1 = (x: number) => Math.round(x * 10) / 10;

/** A room whose newest reading is this recent (by the app clock) is worked out before backfill: our own choice. */
const LIVE_WITHIN_MS = 6 * 3_600_000;
/** Rooms worked out at once: the evaluation mostly waits on MariaDB, so two overlap its round trips. Ours. */
const WATCH_CONCURRENCY = 2;

/** A room with several sensors shows its worst: highest mould index, then most damp hours, then most condensing. */
function worseThan(a: RoomWatch, b: RoomWatch): boolean {
  const x = a.last7Days;
  const y = b.last7Days;
  if (x.mouldIndex !== y.mouldIndex) return x.mouldIndex > y.mouldIndex;
  if (x.hoursAt80 !== y.hoursAt80) return x.hoursAt80 > y.hoursAt80;
  return x.hoursCondensing > y.hoursCondensing;
}

/**
 * What a room's sensor saw, for the tenant's e-mail, which words it as plain, blame-free sentences in
 * the tenant's language (mail-templates.ts, server/locales/<lng>/mail.ts "sensorFinding.*").
 */
export function findingsFor(alert: Pick<SensorAlert, "rule" | "figures">, roomName: string | null): SensorFinding {
  return {
    room: roomName,
    rule: alert.rule,
    hoursAt80: alert.figures.hoursAt80,
    condensingDays: alert.figures.condensingDays,
  };
}

/**
 * The per-room watch over live sensor readings: recomputes a room's figures after its readings
 * arrive (off the request path, one room at a time), raises alerts by the landlord's rules, and
 * turns an alert into a proactive case. Everything it stores is worked out again from
 * `sensor_readings`, so a crash loses nothing: the next batch or the sweep recomputes the room.
 */
export class SensorWatchService implements SensorReadingsListener {
  /** Rooms waiting: those with a recent reading first, then backfill and the sweep's. Each room waits once. */
  private readonly live = new Set<number>();
  private readonly backlog = new Set<number>();
  /** Rooms being worked out now: never two evaluations of one room at once. */
  private readonly working = new Set<number>();
  private readonly workers = new Set<Promise<void>>();
  private weather: OutdoorWeather | null = null;
  private triage: TriageRefresher | null = null;

  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
    private readonly properties: PropertyService,
    private readonly policy: PolicyService,
    private readonly readings: Pick<SensorIngestService, "sensorsOfRoom" | "recentReadings">,
    private readonly clock: Clock,
    private readonly logger: Logger,
  ) {}

  /** The weather module's outdoor hours, used to estimate surfaces where no probe measures one. */
  useWeather(weather: OutdoorWeather): void {
    this.weather = weather;
  }

  useTriage(triage: TriageRefresher): void {
    this.triage = triage;
  }

  /**
   * SensorReadingsListener: queues the batch's rooms (each once however many batches or sensors sent)
   * and returns at once. A room whose newest reading is recent goes ahead of backfill and the sweep's.
   */
  readingsStored(batch: StoredReadingsBatch): void {
    const recentFrom = this.clock.now().getTime() - LIVE_WITHIN_MS;
    for (const s of batch.sensors) {
      if (s.newestTakenAt.getTime() >= recentFrom) {
        this.backlog.delete(s.roomId);
        this.live.add(s.roomId);
      } else if (!this.live.has(s.roomId)) this.backlog.add(s.roomId);
    }
    this.kick();
  }

  /** Rooms waiting to be worked out (live and backlog). */
  get queued(): number {
    return this.live.size + this.backlog.size;
  }

  /** Resolves once every queued room has been worked out (tests, shutdown). */
  async drain(): Promise<void> {
    while (this.workers.size > 0) await Promise.all(this.workers);
  }

  /** The next room to work out, taken off its queue: live first; a room being worked waits its turn. */
  private take(): number | undefined {
    for (const queue of [this.live, this.backlog])
      for (const roomId of queue)
        if (!this.working.has(roomId)) {
          queue.delete(roomId);
          return roomId;
        }
    return undefined;
  }

  private kick(): void {
    while (this.workers.size < WATCH_CONCURRENCY && this.workers.size < this.queued) {
      const worker: Promise<void> = (async () => {
        // setImmediate: the ingest's reply goes out before any evaluation starts.
        await new Promise((resolve) => setImmediate(resolve));
        for (let roomId = this.take(); roomId !== undefined; roomId = this.take()) {
          this.working.add(roomId);
          await this.recomputeRoom(roomId)
            .catch((err: unknown) => this.logger.error({ err, roomId }, "sensor room evaluation failed"))
            .finally(() => this.working.delete(roomId));
        }
      })().finally(() => {
        this.workers.delete(worker);
        // A room queued again while it was being worked may be left with no worker.
        if (this.queued > 0) this.kick();
      });
      this.workers.add(worker);
    }
  }

  /**
   * Queues rooms whose figures are behind their sensors' latest readings (or missing): what a crash
   * or a restart left undone. Returns how many were queued.
   */
  async sweep(limit = 1000): Promise<number> {
    const rows = (await this.dataSource.query(
      `SELECT s.room_id AS roomId FROM sensors s
         LEFT JOIN sensor_room_figures f ON f.room_id = s.room_id
        WHERE s.removed_on IS NULL AND s.last_reading_at IS NOT NULL
          AND (f.room_id IS NULL OR s.last_reading_at > f.latest_reading_at)
        GROUP BY s.room_id LIMIT ?`,
      [limit],
    )) as { roomId: number }[];
    for (const r of rows) if (!this.live.has(Number(r.roomId))) this.backlog.add(Number(r.roomId));
    this.kick();
    return rows.length;
  }

  /** Adds the weather's outdoor temperature of each reading's hour, where the weather knows it. */
  private async withOutdoor(propertyId: number, samples: SensorSample[]): Promise<SensorSample[]> {
    if (!this.weather || samples.length === 0) return samples;
    const hours = await this.weather
      .outdoorHourly(propertyId, samples[0].at, samples[samples.length - 1].at)
      .catch((err: unknown) => {
        this.logger.warn({ err, propertyId }, "outdoor weather unavailable; surfaces judged without it");
        return [];
      });
    const byHour = new Map(hours.map((h) => [Math.floor(h.at.getTime() / 3_600_000), h.temperatureC]));
    return samples.map((s) => ({ ...s, outdoorTemperatureC: byHour.get(Math.floor(s.at.getTime() / 3_600_000)) ?? null }));
  }

  /**
   * Works a room's figures out again from its sensors' readings, stores them, and raises the alerts
   * its rules call for (each at the hour it first held; none again within the cooldown). Idempotent.
   * An alert on a home with an open case goes onto that case (timeline, triage figures) in the same
   * transaction. Returns the new alerts.
   */
  async recomputeRoom(roomId: number): Promise<SensorAlert[]> {
    const sensors = await this.readings.sensorsOfRoom(roomId);
    if (sensors.length === 0) return [];
    const { organisationId, propertyId } = sensors[0];
    // Independent reads side by side: the evaluation mostly waits on round trips to MariaDB.
    const [home, settings, readings] = await Promise.all([
      this.properties.homeWithRooms(propertyId),
      this.policy.sensorAlertPolicyFor(organisationId),
      Promise.all(
        sensors.map(async (s) => this.withOutdoor(propertyId, await this.readings.recentReadings(s.id, MOULD_HISTORY_DAYS))),
      ),
    ]);
    const roomName = home.rooms?.find((r) => r.id === roomId)?.name ?? "A room";

    let worst: { sensorId: number; watch: RoomWatch } | null = null;
    const held: (RuleHeld & { sensorId: number; basis: string })[] = [];
    for (const [i, sensor] of sensors.entries()) {
      const samples = readings[i];
      if (samples.length === 0) continue;
      const watch = watchRoom({ samples, element: sensorElement(home, sensor.placement), settings });
      for (const h of watch.held) held.push({ ...h, sensorId: sensor.id, basis: watch.basis });
      if (!worst || worseThan(watch, worst.watch)) worst = { sensorId: sensor.id, watch };
    }
    if (!worst || !worst.watch.latest) return [];
    held.sort((a, b) => a.at.getTime() - b.at.getTime());
    const now = this.clock.now();
    const { watch } = worst;

    const latest = watch.latest!;
    const figures = {
      roomId,
      organisationId,
      propertyId,
      sensorId: worst.sensorId,
      surfaceBasis: watch.basis,
      hoursAt80: watch.last7Days.hoursAt80,
      hoursCondensing: watch.last7Days.hoursCondensing,
      condensingDays: watch.last7Days.condensingDays,
      mouldIndex: watch.last7Days.mouldIndex,
      days: watch.days,
      latestReadingAt: latest.at,
      latestAirTemperatureC: latest.airTemperatureC,
      latestRelativeHumidityPct: latest.relativeHumidityPct,
      latestSurfaceRelativeHumidityPct: latest.surfaceRelativeHumidityPct,
      computedAt: now,
    };
    // Most evaluations raise nothing: then the figures are one statement, with no transaction or lock.
    // Alerts are only ever added, so "nothing to raise" read without the lock still holds under it.
    if (
      held.length === 0 ||
      alertsToRaise(held, await this.lastRaisedOf(this.dataSource.manager, roomId, false), settings.cooldownDays).length === 0
    ) {
      await this.dataSource.getRepository(SensorRoomFigures).upsert(figures, ["roomId"]);
      return [];
    }

    const { raised, caseIds } = await inTransaction(this.dataSource, async (m) => {
      await m.getRepository(SensorRoomFigures).upsert(figures, ["roomId"]);
      // Read again under lock so two evaluations of one room cannot both raise.
      const lastRaised = await this.lastRaisedOf(m, roomId, true);
      const toRaise = alertsToRaise(held, lastRaised, settings.cooldownDays) as typeof held;
      if (toRaise.length === 0) return { raised: [] as SensorAlert[], caseIds: [] as number[] };
      const openCase = await this.openCaseOf(organisationId, propertyId);
      const repo = m.getRepository(SensorAlert);
      const raised: SensorAlert[] = [];
      for (const h of toRaise) {
        const insert = await repo
          .createQueryBuilder()
          .insert()
          .orIgnore()
          .values({
            organisationId,
            propertyId,
            roomId,
            sensorId: h.sensorId,
            rule: h.rule,
            raisedAt: h.at,
            figures: { ...h.figures, basis: h.basis },
            state: openCase ? "acknowledged" : "open",
            caseId: openCase?.id ?? null,
            createdAt: now,
          })
          .execute();
        const id = insert.identifiers[0]?.id as number | undefined;
        if (!id) continue;
        const alert = await repo.findOneByOrFail({ id });
        raised.push(alert);
        if (openCase) await this.recordOnCase(m, openCase.id, alert, roomName);
      }
      return { raised, caseIds: openCase && raised.length ? [openCase.id] : [] };
    });
    // The stale mark is committed with the alert; refreshing now only saves waiting for the sweep.
    for (const id of caseIds)
      await this.triage?.refresh(id).catch((err: unknown) => this.logger.warn({ err }, "triage refresh failed"));
    if (raised.length) this.logger.info({ roomId, alerts: raised.map((a) => a.rule) }, "sensor alerts raised");
    return raised;
  }

  /** The room's latest alert per rule; under lock in the raising transaction. */
  private async lastRaisedOf(m: EntityManager, roomId: number, lock: boolean): Promise<Partial<Record<SensorAlertRule, Date>>> {
    const last = (await m.query(
      `SELECT rule, MAX(raised_at) AS at FROM sensor_alerts WHERE room_id = ? GROUP BY rule${lock ? " FOR UPDATE" : ""}`,
      [roomId],
    )) as { rule: SensorAlertRule; at: Date }[];
    return Object.fromEntries(last.map((r) => [r.rule, new Date(r.at)]));
  }

  private async openCaseOf(organisationId: number, propertyId: number): Promise<Case | null> {
    const open = (await this.cases.forHome(organisationId, propertyId)).filter((c) => OPEN_CASE_STATUSES.includes(c.status));
    return open[0] ?? null;
  }

  /** The alert on the case's staff timeline (which marks its triage figures stale), in the caller's transaction. */
  private async recordOnCase(m: EntityManager, caseId: number, alert: SensorAlert, roomName: string): Promise<void> {
    await this.cases.recordEvent(m, {
      caseId,
      actorId: null,
      type: "sensor-alert",
      after: {
        alertId: alert.id,
        rule: alert.rule,
        roomId: alert.roomId,
        roomName,
        raisedAt: alert.raisedAt.toISOString(),
        hoursAt80: round1(alert.figures.hoursAt80),
        hoursCondensing: round1(alert.figures.hoursCondensing),
        condensingDays: alert.figures.condensingDays,
        mouldIndex: Math.round(alert.figures.mouldIndex * 100) / 100,
        basis: alert.figures.basis,
      },
    });
  }

  /**
   * What triage reads from the sensors for a case: the worst of the alerts on it that are not
   * resolved (condensing days → "condensing", the others → "mould-risk") and their highest mould index.
   */
  async riskOfCase(caseId: number): Promise<{ state: SurfaceState | null; mouldIndex: number | null }> {
    const alerts = await this.dataSource
      .getRepository(SensorAlert)
      .createQueryBuilder("a")
      .where("a.case_id = :caseId AND a.state <> 'resolved'", { caseId })
      .getMany();
    if (alerts.length === 0) return { state: null, mouldIndex: null };
    let state: SurfaceState = "mould-risk";
    if (alerts.some((a) => a.rule === "condensing-days")) state = "condensing";
    return { state, mouldIndex: Math.max(...alerts.map((a) => a.figures.mouldIndex)) };
  }

  /** The worse of two surface judgements (triage combines the readings' and the sensors'). */
  static worse(a: SurfaceState | null, b: SurfaceState | null): SurfaceState | null {
    if (a === null) return b;
    if (b === null) return a;
    return SURFACE_STATES.indexOf(a) >= SURFACE_STATES.indexOf(b) ? a : b;
  }

  /** Homes of the actor's landlord with open alerts and no open case, with their rooms' figures. */
  async homesAtRisk(actor: Actor, sort: AlertSort = "raisedAt", dir: "asc" | "desc" = "desc"): Promise<HomeAtRisk[]> {
    const alerts = await this.dataSource
      .getRepository(SensorAlert)
      .createQueryBuilder("a")
      .where("a.organisation_id = :org AND a.state = 'open' AND a.case_id IS NULL", { org: actor.organisationId })
      .andWhere(`NOT EXISTS (SELECT 1 FROM cases c WHERE c.property_id = a.property_id AND c.status IN (:...open))`, {
        open: OPEN_CASE_STATUSES,
      })
      .orderBy("a.raised_at", "ASC")
      .addOrderBy("a.id", "ASC")
      .take(5000)
      .getMany();
    const byHome = new Map<number, SensorAlert[]>();
    for (const a of alerts) byHome.set(a.propertyId, [...(byHome.get(a.propertyId) ?? []), a]);
    const out: HomeAtRisk[] = [];
    for (const [propertyId, homeAlerts] of byHome) {
      const home = await this.properties.homeWithRooms(propertyId);
      const names = new Map((home.rooms ?? []).map((r) => [r.id, r.name]));
      const figures = await this.dataSource.getRepository(SensorRoomFigures).findBy({ propertyId });
      out.push({
        property: home,
        alerts: homeAlerts,
        rooms: figures
          .filter((f) => homeAlerts.some((a) => a.roomId === f.roomId))
          .map((f) => Object.assign(f, { roomName: names.get(f.roomId) ?? "Room" })),
      });
    }
    const key = (h: HomeAtRisk): number | string => {
      switch (sort) {
        case "mouldIndex":
          return Math.max(0, ...h.rooms.map((r) => r.mouldIndex));
        case "hoursAt80":
          return Math.max(0, ...h.rooms.map((r) => r.hoursAt80));
        case "address":
          return addressOf(h.property).toLowerCase();
        default:
          return Math.min(...h.alerts.map((a) => a.raisedAt.getTime()));
      }
    };
    out.sort((a, b) => {
      const x = key(a);
      const y = key(b);
      const c = x < y ? -1 : x > y ? 1 : a.property.id - b.property.id;
      return dir === "asc" ? c : -c;
    });
    return out;
  }

  /** The alert, if it is the actor's landlord's (404 otherwise). */
  private async alertFor(m: EntityManager, actor: Actor, alertId: number, lock: boolean): Promise<SensorAlert> {
    const qb = m.getRepository(SensorAlert).createQueryBuilder("a").where("a.id = :alertId", { alertId });
    if (lock) qb.setLock("pessimistic_write");
    const alert = await qb.getOne();
    if (!alert || alert.organisationId !== actor.organisationId) throw new NotFoundError("No such alert.");
    return alert;
  }

  /**
   * Opens a proactive case (channel "sensor") for the alert's home, linking every open alert of the
   * home to it, and tells the tenant through the outbox. Idempotent: the alert row is locked first, so
   * a second officer's click waits and then gets the same case (`created: false`).
   */
  async openProactiveCase(actor: Actor, alertId: number): Promise<{ caseId: number; reference: string; created: boolean }> {
    const { result, deliveries } = await inTransaction(this.dataSource, async (m) => {
      const alert = await this.alertFor(m, actor, alertId, true);
      if (alert.caseId !== null) {
        const c = await this.cases.findById(alert.caseId);
        return { result: { caseId: alert.caseId, reference: c?.reference ?? "", created: false }, deliveries: [] };
      }
      if (alert.state === "resolved") throw new ConflictError("This alert was dismissed; no case was opened.");
      const existing = await this.openCaseOf(alert.organisationId, alert.propertyId);
      if (existing)
        throw new ConflictError(`This home already has an open case (${existing.reference}); the alert is shown there.`);
      const homeAlerts = await m
        .getRepository(SensorAlert)
        .createQueryBuilder("a")
        .setLock("pessimistic_write")
        .where("a.property_id = :p AND a.state = 'open' AND a.case_id IS NULL", { p: alert.propertyId })
        .orderBy("a.raised_at", "ASC")
        .getMany();
      const home = await this.properties.homeWithRooms(alert.propertyId);
      const names = new Map((home.rooms ?? []).map((r) => [r.id, r.name]));
      const roomIds = [...new Set(homeAlerts.map((a) => a.roomId))];
      const findings = homeAlerts.map((a) => findingsFor(a, names.get(a.roomId) ?? null));
      const rules = [...new Set(homeAlerts.map((a) => RULE_WORDS[a.rule]))];
      const { saved, deliveries } = await this.cases.openFromSensor(m, actor, {
        propertyId: alert.propertyId,
        // The landlord could have known from the hour the first alert was raised.
        awareAt: homeAlerts[0].raisedAt,
        description: `Opened by the landlord from its sensors' alerts (${rules.join(", ")}) in ${roomIds
          .map((id) => names.get(id) ?? "a room")
          .join(", ")}; no report from the household.`,
        locations: ["other"],
        observations: homeAlerts.some((a) => a.rule === "condensing-days") ? ["condensation"] : [],
        roomIds,
        findings,
      });
      for (const a of homeAlerts) {
        await m
          .getRepository(SensorAlert)
          .update(a.id, { caseId: saved.id, state: "acknowledged", closedById: actor.id, closedAt: this.clock.now() });
        await this.recordOnCase(m, saved.id, a, names.get(a.roomId) ?? "A room");
      }
      return { result: { caseId: saved.id, reference: saved.reference!, created: true }, deliveries };
    });
    for (const deliver of deliveries) await deliver().catch(() => undefined);
    if (result.created) await this.triage?.refresh(result.caseId).catch(() => undefined);
    return result;
  }

  /** Dismisses every open alert of the alert's home with the officer's reason (no case is opened). */
  async dismiss(actor: Actor, alertId: number, reason: string): Promise<{ dismissed: number }> {
    return inTransaction(this.dataSource, async (m) => {
      const alert = await this.alertFor(m, actor, alertId, true);
      if (alert.state !== "open" || alert.caseId !== null) throw new ConflictError("This alert is no longer open.");
      const result = await m
        .getRepository(SensorAlert)
        .createQueryBuilder()
        .update()
        .set({ state: "resolved", dismissedReason: reason, closedById: actor.id, closedAt: this.clock.now() })
        .where("property_id = :p AND state = 'open' AND case_id IS NULL", { p: alert.propertyId })
        .execute();
      return { dismissed: result.affected ?? 0 };
    });
  }
}
