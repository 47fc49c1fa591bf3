// Readings over MQTT against a real mosquitto (Debian's, started for this file on a free port in a
// temporary folder) and the real MariaDB: devices sign in with the secret the lead was shown, may
// publish only to their own topic, are cut off when revoked, and what they publish is stored once.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import mqtt, { type MqttClient } from "mqtt";
import { afterAll, beforeAll, expect, it } from "vitest";
import { freePort } from "../../scripts/lib/mariadb.js";
import { startMosquitto, stopMosquitto, type Mosquitto } from "../../scripts/lib/mosquitto.js";
import { sensorReadingsTopic } from "../../server/modules/sensors/mqtt/broker-files.js";
import { SensorSubscriber } from "../../server/modules/sensors/mqtt/subscriber.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { daysAgo, hoursAgo } from "../support/test-clock.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let dir: string;
let broker: Mosquitto;
let t: TestApp;
let lead: Client;
let subscriber: SensorSubscriber;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let roomId: number;
let serialNo = 0;
const devices: MqttClient[] = [];

const iso = (d: Date) => `${d.toISOString().slice(0, 19)}Z`;
const reading = (at: Date, over: Record<string, unknown> = {}) => ({
  takenAt: iso(at),
  airTemperatureC: 18.5,
  relativeHumidityPct: 74,
  ...over,
});

/** Waits for a state (never for a time): polls until `check` passes, at most 15 s. */
async function until<T>(read: () => Promise<T> | T, check: (value: T) => boolean): Promise<T> {
  let value = await read();
  for (let i = 0; i < 300 && !check(value); i++) {
    await new Promise((r) => setTimeout(r, 50));
    value = await read();
  }
  expect(check(value)).toBe(true);
  return value;
}

async function register() {
  serialNo += 1;
  const res = await lead
    .post("/api/sensors", {
      propertyId: landlord.home.id,
      roomId,
      serial: `MQ-${Date.now().toString(36)}-${serialNo}`,
      model: "TH-2",
      placement: "external wall corner, 0.3 m above floor",
      measuresSurface: false,
      intervalS: 900,
      installedOn: localDate(daysAgo(20)),
    })
    .expect(201);
  return {
    id: res.body.sensor.id as number,
    username: res.body.sensor.mqttUsername as string,
    secret: res.body.credentials.secret as string,
  };
}

const connectDevice = (username: string, password: string) =>
  mqtt.connectAsync(broker.url, { username, password, protocolVersion: 5, reconnectPeriod: 0, connectTimeout: 5000 });

/** Connects once the broker has reloaded its files (the reload follows the registry's change by a moment). */
async function signedInDevice(device: { username: string; secret: string }): Promise<MqttClient> {
  let client: MqttClient | null = null;
  for (let i = 0; i < 100 && !client; i++) {
    client = await connectDevice(device.username, device.secret).catch(() => null);
    if (!client) await new Promise((r) => setTimeout(r, 50));
  }
  expect(client).not.toBeNull();
  devices.push(client!);
  return client!;
}

const rowsOf = async (sensorId: number) =>
  Number((await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM sensor_readings WHERE sensor_id = ?", [sensorId]))[0].n);

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "dewline-test-mqtt-"));
  broker = await startMosquitto({ dir, port: await freePort() });
  t = await createTestApp({
    MQTT_URL: broker.url,
    MQTT_USERNAME: broker.app.username,
    MQTT_PASSWORD: broker.app.password,
    MQTT_BROKER_DIR: dir,
    MQTT_CLIENT_ID: `dewline-test-${process.pid}`,
    MQTT_BATCH_MS: "50",
  });
  landlord = await makeLandlord(t.ctx.dataSource);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  roomId = (await lead.get(`/api/properties/${landlord.home.id}`).expect(200)).body.rooms[0].id;
  const { mqtt: settings } = t.ctx.config;
  subscriber = new SensorSubscriber(t.ctx.services.sensorIngest, { ...settings, password: settings.password! }, t.ctx.logger);
  t.ctx.services.mqttBroker.onChange(() => subscriber.forgetIdentities());
  subscriber.start();
  await until(
    () => subscriber.subscribed,
    (s) => s,
  );
}, 60_000);

afterAll(async () => {
  await Promise.all(devices.map((d) => d.endAsync().catch(() => undefined)));
  await subscriber?.stop();
  await t?.close();
  await stopMosquitto(dir);
  rmSync(dir, { recursive: true, force: true });
});

it("stores what a device publishes, as a batch or a single reading", async () => {
  const sensor = await register();
  const device = await signedInDevice(sensor);
  const topic = sensorReadingsTopic(sensor.username);
  await device.publishAsync(
    topic,
    JSON.stringify({ readings: [reading(hoursAgo(3)), reading(hoursAgo(2)), reading(hoursAgo(1))] }),
    { qos: 1 },
  );
  await device.publishAsync(topic, JSON.stringify(reading(hoursAgo(0.5), { relativeHumidityPct: 81.5 })), { qos: 1 });
  await until(
    () => rowsOf(sensor.id),
    (n) => n === 4,
  );
  const [latest] = await t.ctx.dataSource.query(
    "SELECT relative_humidity_pct FROM sensor_readings WHERE sensor_id = ? ORDER BY taken_at DESC LIMIT 1",
    [sensor.id],
  );
  expect(Number(latest.relative_humidity_pct)).toBe(81.5);
});

it("refuses a wrong secret, and another device's secret", async () => {
  const [a, b] = [await register(), await register()];
  await signedInDevice(a); // the broker has reloaded with both by now
  await expect(connectDevice(a.username, "dws_" + "x".repeat(43))).rejects.toMatchObject({ code: 135 });
  await expect(connectDevice(a.username, b.secret)).rejects.toMatchObject({ code: 135 });
});

it("refuses a device publishing to another device's topic, and stores nothing for that device", async () => {
  const [a, b] = [await register(), await register()];
  const deviceA = await signedInDevice(a);
  await expect(
    deviceA.publishAsync(sensorReadingsTopic(b.username), JSON.stringify({ readings: [reading(hoursAgo(2))] }), { qos: 1 }),
  ).rejects.toMatchObject({ code: 135 });
  // Its own reading, published after, arrives: everything before it has been handled too.
  await deviceA.publishAsync(sensorReadingsTopic(a.username), JSON.stringify(reading(hoursAgo(1))), { qos: 1 });
  await until(
    () => rowsOf(a.id),
    (n) => n === 1,
  );
  await subscriber.idle();
  expect(await rowsOf(b.id)).toBe(0);
});

it("stores re-delivered readings once", async () => {
  const sensor = await register();
  const device = await signedInDevice(sensor);
  const topic = sensorReadingsTopic(sensor.username);
  const batch = JSON.stringify({ readings: [reading(hoursAgo(5)), reading(hoursAgo(4))] });
  const duplicatesBefore = subscriber.counts.duplicates;
  await device.publishAsync(topic, batch, { qos: 1 });
  await until(
    () => rowsOf(sensor.id),
    (n) => n === 2,
  );
  await device.publishAsync(topic, batch, { qos: 1 });
  await until(
    () => subscriber.counts.duplicates - duplicatesBefore,
    (n) => n === 2,
  );
  expect(await rowsOf(sensor.id)).toBe(2);
});

it("drops what is not a reading, counts it, and keeps going", async () => {
  const sensor = await register();
  const device = await signedInDevice(sensor);
  const topic = sensorReadingsTopic(sensor.username);
  const before = subscriber.counts.badPayloads;
  await device.publishAsync(topic, "not json", { qos: 1 });
  await device.publishAsync(topic, JSON.stringify({ temperature: 20 }), { qos: 1 });
  await device.publishAsync(topic, JSON.stringify({ readings: [] }), { qos: 1 });
  await device.publishAsync(topic, JSON.stringify(reading(hoursAgo(1))), { qos: 1 });
  await until(
    () => rowsOf(sensor.id),
    (n) => n === 1,
  );
  expect(subscriber.counts.badPayloads - before).toBe(3);
  expect(subscriber.subscribed).toBe(true);
});

it("cuts off a revoked device: it is disconnected, cannot sign in again, and nothing more is stored", async () => {
  const sensor = await register();
  const device = await signedInDevice(sensor);
  const topic = sensorReadingsTopic(sensor.username);
  await device.publishAsync(topic, JSON.stringify(reading(hoursAgo(2))), { qos: 1 });
  await until(
    () => rowsOf(sensor.id),
    (n) => n === 1,
  );
  const closed = new Promise<void>((resolve) => device.once("close", () => resolve()));
  await lead.post(`/api/sensors/${sensor.id}/revoke`).expect(200);
  // mosquitto drops a connected client whose password is gone when it reloads its files.
  await closed;
  await expect(connectDevice(sensor.username, sensor.secret)).rejects.toMatchObject({ code: 135 });
  await subscriber.idle();
  expect(await rowsOf(sensor.id)).toBe(1);
});

it("ignores what a revoked device manages to publish before the broker has reloaded", async () => {
  const sensor = await register();
  const device = await signedInDevice(sensor);
  const topic = sensorReadingsTopic(sensor.username);
  await device.publishAsync(topic, JSON.stringify(reading(hoursAgo(3))), { qos: 1 });
  await until(
    () => rowsOf(sensor.id),
    (n) => n === 1,
  );
  // The revoke has committed but the broker has not been told yet (the moment before its reload).
  await t.ctx.dataSource.query(
    "UPDATE sensors SET revoked_at = NOW(3), key_hash = NULL, mqtt_password_hash = NULL, version = version + 1 WHERE id = ?",
    [sensor.id],
  );
  const refusedBefore = subscriber.counts.refused + subscriber.counts.unknownSensors;
  await device.publishAsync(topic, JSON.stringify(reading(hoursAgo(1))), { qos: 1 });
  await until(
    () => subscriber.counts.refused + subscriber.counts.unknownSensors - refusedBefore,
    (n) => n === 1,
  );
  expect(await rowsOf(sensor.id)).toBe(1);
});
