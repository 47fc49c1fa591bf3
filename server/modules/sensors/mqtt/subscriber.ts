// The app's MQTT subscriber: takes every device's readings from the broker and hands them to the
// sensor ingest, the same checks and storage as over HTTP. MQTT 5 (so the broker's refusals are
// visible to devices), QoS 1, and a shared subscription so several app instances split the messages.
// Readings are gathered per sensor for a moment and stored in one ingest call. The broker has already
// checked the device's password and that the topic is its own; the topic's user name then names the
// sensor, looked up in the registry (and trusted for a few seconds).
import mqtt, { type MqttClient } from "mqtt";
import { sensorReadingBatch } from "../../../../src/lib/schemas/sensor-readings.js";
import type { MqttConfig } from "../../../config/env.js";
import type { Logger } from "../../../lib/logger.js";
import type { IngestOutcome, SensorIdentity } from "../sensor-events.js";
import { SENSOR_READINGS_FILTER } from "./broker-files.js";

/** What the subscriber needs of the sensor ingest (SensorIngestService). */
export interface MqttSensorIngest {
  ingest(sensor: SensorIdentity, readings: unknown[], via: "http" | "mqtt"): Promise<IngestOutcome>;
  identifyByMqttUsername(username: string): Promise<SensorIdentity | null>;
}

export type SubscriberSettings = Pick<
  MqttConfig,
  "url" | "username" | "clientId" | "batchMs" | "batchReadings" | "identityCacheMs"
> & {
  password: string;
  /** Keep the broker session over a restart (MqttConfig.persistentSession); true when not said. */
  persistentSession?: boolean;
};

/** Every app instance joins the same group; the broker gives each message to one of them. */
export const SHARED_SUBSCRIPTION = `$share/dewline/${SENSOR_READINGS_FILTER}`;
const TOPIC = /^sensors\/([A-Za-z0-9_-]{1,40})\/readings$/;
/** Ingest calls running at once (each is one transaction on the app's pool). */
const CONCURRENT_INGESTS = 4;
const BACKOFF_MIN_MS = 500;
const BACKOFF_MAX_MS = 30_000;
/** How long a broker session (and the readings queued in it) waits for this app to come back. */
const SESSION_EXPIRY_S = 3600;

export interface SubscriberCounts {
  messages: number;
  readings: number;
  stored: number;
  duplicates: number;
  /** Readings the ingest refused (each with its reason, logged). */
  refused: number;
  /** Messages dropped: not JSON, not a reading or a batch, another device's serial, or a topic we do not know. */
  badPayloads: number;
  /** Messages from a user name that is no active sensor (revoked or removed since it connected). */
  unknownSensors: number;
  /** Readings lost because the ingest failed (the database was down, say). */
  failedReadings: number;
}

interface PendingBatch {
  sensor: SensorIdentity;
  readings: unknown[];
  timer: NodeJS.Timeout | null;
}

export class SensorSubscriber {
  readonly counts: SubscriberCounts = {
    messages: 0,
    readings: 0,
    stored: 0,
    duplicates: 0,
    refused: 0,
    badPayloads: 0,
    unknownSensors: 0,
    failedReadings: 0,
  };
  private client: MqttClient | null = null;
  private stopping = false;
  private attempt = 0;
  private reconnectTimer: NodeJS.Timeout | null = null;
  private readonly identities = new Map<string, { sensor: SensorIdentity | null; until: number }>();
  private readonly pending = new Map<number, PendingBatch>();
  private readonly ready: (() => Promise<void>)[] = [];
  private running = 0;
  private readonly inFlight = new Set<Promise<void>>();

  constructor(
    private readonly ingest: MqttSensorIngest,
    private readonly settings: SubscriberSettings,
    private readonly logger: Logger,
  ) {}

  /** True once the broker has granted the subscription on the current connection. */
  subscribed = false;

  /** Connects (and keeps reconnecting, with backoff); never waits for the broker and never throws. */
  start(): void {
    if (this.client) return;
    const persistent = this.settings.persistentSession ?? true;
    const client = mqtt.connect(this.settings.url, {
      protocolVersion: 5,
      clientId: this.settings.clientId,
      username: this.settings.username,
      password: this.settings.password,
      // Each instance has its own client id, and all join one shared subscription: the broker hands
      // each message to one of them. A session kept over a restart holds what arrived meanwhile.
      clean: !persistent,
      properties: { sessionExpiryInterval: persistent ? SESSION_EXPIRY_S : 0 },
      // Reconnects are ours, with backoff (mqtt.js would retry at a fixed period).
      reconnectPeriod: 0,
      connectTimeout: 5000,
    });
    this.client = client;
    client.on("connect", (connack) => {
      this.attempt = 0;
      this.subscribed = false;
      this.logger.info({ url: this.settings.url, sessionPresent: connack.sessionPresent }, "MQTT subscriber connected");
      client.subscribe(SHARED_SUBSCRIPTION, { qos: 1 }, (error, granted) => {
        const refused = granted?.some((g) => g.qos > 2);
        if (error || refused) this.logger.error({ err: error, granted }, "MQTT subscription refused");
        else this.subscribed = true;
      });
    });
    client.on("message", (topic, payload) => this.receive(topic, payload));
    client.on("error", (error) => this.logger.warn({ err: error, url: this.settings.url }, "MQTT connection problem"));
    client.on("close", () => {
      this.subscribed = false;
      this.scheduleReconnect();
    });
  }

  /** Stops receiving, stores what has been gathered, then disconnects. */
  async stop(): Promise<void> {
    this.stopping = true;
    if (this.reconnectTimer) clearTimeout(this.reconnectTimer);
    const client = this.client;
    if (client) await new Promise<void>((resolve) => client.end(false, {}, () => resolve()));
    await this.idle();
  }

  /** Stores every batch gathered so far and resolves when every ingest has finished. */
  async idle(): Promise<void> {
    for (;;) {
      for (const id of [...this.pending.keys()]) this.flush(id);
      if (this.inFlight.size === 0 && this.ready.length === 0 && this.pending.size === 0) return;
      await Promise.allSettled([...this.inFlight]);
    }
  }

  /** Forgets the sensors it knows (the registry's credentials changed). */
  forgetIdentities(): void {
    this.identities.clear();
  }

  private scheduleReconnect() {
    if (this.stopping || this.reconnectTimer || !this.client) return;
    const delay = Math.min(BACKOFF_MAX_MS, BACKOFF_MIN_MS * 2 ** this.attempt);
    this.attempt += 1;
    this.logger.warn(
      { url: this.settings.url, retryInMs: delay },
      "MQTT broker not reachable; readings over MQTT wait until it is",
    );
    this.reconnectTimer = setTimeout(() => {
      this.reconnectTimer = null;
      if (!this.stopping) this.client?.reconnect();
    }, delay);
  }

  private receive(topic: string, payload: Buffer) {
    this.counts.messages += 1;
    const match = TOPIC.exec(topic);
    const parsed = match ? parsePayload(payload) : { error: `not a device's readings topic` };
    if ("error" in parsed) {
      this.counts.badPayloads += 1;
      this.logger.warn({ topic, reason: parsed.error }, "MQTT message dropped");
      return;
    }
    const username = match![1]!;
    const lookup = this.identify(username)
      .then((sensor) => {
        if (!sensor) {
          this.counts.unknownSensors += 1;
          this.logger.warn({ topic }, "MQTT readings from no active sensor dropped");
          return;
        }
        if (parsed.serial !== undefined && parsed.serial !== sensor.serial) {
          this.counts.badPayloads += 1;
          this.logger.warn({ topic, serial: parsed.serial }, "MQTT readings naming another serial dropped");
          return;
        }
        this.gather(sensor, parsed.readings);
      })
      .catch((error: unknown) => {
        this.counts.failedReadings += parsed.readings.length;
        this.logger.error({ err: error, topic }, "could not look up the sensor of an MQTT message");
      })
      .finally(() => this.inFlight.delete(lookup));
    this.inFlight.add(lookup);
  }

  private async identify(username: string): Promise<SensorIdentity | null> {
    const now = performance.now();
    const known = this.identities.get(username);
    if (known && known.until > now) return known.sensor;
    const sensor = await this.ingest.identifyByMqttUsername(username);
    this.identities.set(username, { sensor, until: now + this.settings.identityCacheMs });
    return sensor;
  }

  private gather(sensor: SensorIdentity, readings: unknown[]) {
    this.counts.readings += readings.length;
    let batch = this.pending.get(sensor.id);
    if (!batch) {
      batch = { sensor, readings: [], timer: null };
      this.pending.set(sensor.id, batch);
    }
    batch.readings.push(...readings);
    if (batch.readings.length >= this.settings.batchReadings) this.flush(sensor.id);
    else batch.timer ??= setTimeout(() => this.flush(sensor.id), this.settings.batchMs);
  }

  private flush(sensorId: number) {
    const batch = this.pending.get(sensorId);
    if (!batch) return;
    this.pending.delete(sensorId);
    if (batch.timer) clearTimeout(batch.timer);
    this.ready.push(() => this.store(batch));
    this.pump();
  }

  private pump() {
    while (this.running < CONCURRENT_INGESTS && this.ready.length > 0) {
      const next = this.ready.shift()!;
      this.running += 1;
      const run = next().finally(() => {
        this.running -= 1;
        this.inFlight.delete(run);
        this.pump();
      });
      this.inFlight.add(run);
    }
  }

  private async store(batch: PendingBatch) {
    try {
      const outcome = await this.ingest.ingest(batch.sensor, batch.readings, "mqtt");
      this.counts.stored += outcome.stored;
      this.counts.duplicates += outcome.duplicates;
      this.counts.refused += outcome.refused.length;
      if (outcome.refused.length > 0) {
        this.logger.warn(
          { sensorId: batch.sensor.id, refused: outcome.refused.slice(0, 5), count: outcome.refused.length },
          "MQTT readings refused",
        );
      }
    } catch (error) {
      this.counts.failedReadings += batch.readings.length;
      this.logger.error({ err: error, sensorId: batch.sensor.id, readings: batch.readings.length }, "MQTT readings not stored");
    }
  }
}

/** A batch (`sensorReadingBatch`) or a single reading object; anything else is an error. */
export function parsePayload(payload: Buffer): { serial?: string; readings: unknown[] } | { error: string } {
  let body: unknown;
  try {
    body = JSON.parse(payload.toString("utf8"));
  } catch {
    return { error: "not JSON" };
  }
  if (typeof body !== "object" || body === null || Array.isArray(body)) return { error: "not a JSON object" };
  if ("readings" in body) {
    const batch = sensorReadingBatch.safeParse(body);
    if (!batch.success) return { error: batch.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ") };
    return { serial: batch.data.serial, readings: batch.data.readings };
  }
  if ("takenAt" in body) return { readings: [body] };
  return { error: "neither a reading nor a batch of readings" };
}
