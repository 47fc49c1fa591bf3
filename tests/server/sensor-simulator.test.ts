// The sensor simulator against the real app and MariaDB: it fits its sensors through the registry,
// sends a week of backfill over the HTTP ingest, every reading stored is exactly the generator's, and
// the room whose condensation story unfolds over that week has its alert (as the demo's Alerts need);
// a second run finds its sensors again, issues new secrets (the old ones stop working) and keeps its
// stories' dates, and what it sends again is counted as duplicates.
import { mkdtempSync, rmSync } from "node:fs";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import { pino } from "pino";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { freePort } from "../../scripts/lib/mariadb.js";
import { startMosquitto, stopMosquitto, type Mosquitto } from "../../scripts/lib/mosquitto.js";
import { simulatedReading } from "../../scripts/lib/sensor-series.js";
import { startSimulation, type SimulationOptions } from "../../scripts/simulate-sensors.js";
import { SensorSubscriber } from "../../server/modules/sensors/mqtt/subscriber.js";
import { makeLandlord, makeProperty } from "../support/factories.js";
import { testClock } from "../support/test-clock.js";
import { createTestApp, type TestApp } from "../support/test-app.js";

let t: TestApp;
let server: Server;
let options: SimulationOptions;
const lines: string[] = [];

beforeAll(async () => {
  t = await createTestApp();
  const landlord = await makeLandlord(t.ctx.dataSource);
  await makeProperty(t.ctx.dataSource, landlord.org);
  await makeProperty(t.ctx.dataSource, landlord.org);
  server = await new Promise((resolve) => {
    const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : 0;
  options = {
    homes: 3,
    intervalS: 900,
    speed: 1,
    transport: "http",
    backfillMs: 7 * 86_400_000,
    leadMs: 0,
    seed: 7,
    landlord: landlord.org.name,
    appUrl: `http://127.0.0.1:${port}`,
    mqttUrl: "mqtt://127.0.0.1:1",
    durationMs: 0,
    verbose: false,
    log: (line) => lines.push(line),
    clock: testClock,
  };
});

afterAll(async () => {
  server?.closeAllConnections();
  await new Promise((r) => server?.close(r));
  await t?.close();
});

const rowsOf = async (sensorId: number, on: TestApp = t) =>
  (await on.ctx.dataSource.query(
    "SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct FROM sensor_readings WHERE sensor_id = ? ORDER BY taken_at",
    [sensorId],
  )) as {
    taken_at: Date;
    air_temperature_c: string;
    relative_humidity_pct: string;
    surface_temperature_c: string | null;
    battery_pct: number;
  }[];

describe("the sensor simulator", () => {
  it("fits sensors through the registry, every reading it sends over HTTP is stored as generated, and the story raises its alert", async () => {
    const first = await startSimulation(t.ctx, options);
    const tally = await first.done;
    // Three homes: the first two carry the condensation and leak stories (two sensors each), the third
    // the dead kitchen sensor (three).
    expect(first.devices).toHaveLength(7);
    expect(first.devices[1]!.series.script.kind).toBe("developing-condensation");
    expect(first.devices[2]!.series.script.kind).toBe("leak");
    expect(tally).toMatchObject({ refused: 0, rejected: 0, duplicates: 0 });

    let stored = 0;
    for (const device of first.devices) {
      const rows = await rowsOf(device.sensorId);
      const script = device.series.script;
      if (script.kind === "dead") {
        // Dead on day 5 of its story: readings until then, none after.
        expect(rows.length).toBeGreaterThan(96);
        expect(new Date(rows.at(-1)!.taken_at).getTime()).toBeLessThan(script.fromMs);
      } else {
        // A week at 15 minutes, and perhaps the live second's reading.
        expect(rows.length).toBeGreaterThanOrEqual(7 * 96);
        expect(rows.length).toBeLessThanOrEqual(7 * 96 + 1);
      }
      for (const row of rows) {
        const expected = simulatedReading(options.seed, device.series, new Date(row.taken_at).getTime())!;
        expect(Number(row.air_temperature_c)).toBe(expected.airTemperatureC);
        expect(Number(row.relative_humidity_pct)).toBe(expected.relativeHumidityPct);
        expect(row.surface_temperature_c === null ? undefined : Number(row.surface_temperature_c)).toBe(
          expected.surfaceTemperatureC,
        );
        expect(row.battery_pct).toBe(expected.batteryPct);
      }
      stored += rows.length;
    }
    expect(tally.stored).toBe(stored);
    expect(tally.sent).toBe(stored);
    expect(lines.some((l) => l.startsWith("Backfill "))).toBe(true);

    await t.ctx.services.sensorWatch.drain();
    const alerted = (await t.ctx.dataSource.query("SELECT DISTINCT room_id AS roomId FROM sensor_alerts WHERE sensor_id IN (?)", [
      first.devices.map((d) => d.sensorId),
    ])) as { roomId: number }[];
    const condensing = first.devices.find((d) => d.series.script.kind === "developing-condensation")!;
    const condensingRoom = (
      (await t.ctx.dataSource.query("SELECT room_id AS roomId FROM sensors WHERE id = ?", [condensing.sensorId])) as {
        roomId: number;
      }[]
    )[0]!.roomId;
    // Only that room: the ordinary rooms' series stay clear of the alert rules.
    expect(alerted.map((a) => Number(a.roomId))).toEqual([Number(condensingRoom)]);

    // A second run: the same sensors, new secrets, the same stories; the re-sent day is all duplicates.
    const second = await startSimulation(t.ctx, options);
    const again = await second.done;
    expect(second.devices.map((d) => d.sensorId)).toEqual(first.devices.map((d) => d.sensorId));
    expect(second.devices.map((d) => d.series.script)).toEqual(first.devices.map((d) => d.series.script));
    expect(again.refused).toBe(0);
    expect(again.duplicates).toBeGreaterThanOrEqual(stored - 7);
    const reading = { readings: [{ takenAt: testClock.now().toISOString(), airTemperatureC: 20, relativeHumidityPct: 50 }] };
    await request(t.app)
      .post("/api/sensor-ingest/readings")
      .set("Authorization", `Bearer ${first.devices[0]!.secret}`)
      .send(reading)
      .expect(401);
  });
});

describe("the sensor simulator without a broker", () => {
  it("sends an MQTT device's readings over HTTP instead, and says so", async () => {
    lines.length = 0;
    const sim = await startSimulation(t.ctx, { ...options, transport: "mqtt", homes: 1, backfillMs: 3_600_000 });
    const tally = await sim.done;
    expect(sim.devices.map((d) => d.transport)).toEqual(["http", "http"]);
    expect(lines.filter((l) => l.includes("sending over HTTP instead"))).toHaveLength(2);
    expect(tally.sent).toBeGreaterThan(0);
    expect(tally).toMatchObject({ refused: 0, rejected: 0 });
    expect(tally.stored + tally.duplicates).toBe(tally.sent);
  });
});

describe("the sensor simulator over MQTT", () => {
  let dir: string;
  let broker: Mosquitto;
  let m: TestApp;
  let subscriber: SensorSubscriber;
  let landlordName: string;

  beforeAll(async () => {
    dir = mkdtempSync(path.join(tmpdir(), "dewline-test-simulator-"));
    broker = await startMosquitto({ dir, port: await freePort() });
    // The registry keeps this broker's password file in step, so each new device may sign in.
    m = await createTestApp({
      MQTT_URL: broker.url,
      MQTT_USERNAME: broker.app.username,
      MQTT_PASSWORD: broker.app.password,
      MQTT_BROKER_DIR: dir,
    });
    const cfg = m.ctx.config.mqtt;
    subscriber = new SensorSubscriber(
      m.ctx.services.sensorIngest,
      { ...cfg, clientId: `simulator-test-${process.pid}`, password: broker.app.password },
      pino({ level: "silent" }),
    );
    subscriber.start();
    const landlord = await makeLandlord(m.ctx.dataSource);
    landlordName = landlord.org.name;
  });

  afterAll(async () => {
    await subscriber?.stop();
    await m?.close();
    if (dir) await stopMosquitto(dir);
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it("publishes each device's readings with its own MQTT credentials, and the app stores them as generated", async () => {
    const sim = await startSimulation(m.ctx, {
      ...options,
      transport: "mqtt",
      homes: 1,
      landlord: landlordName,
      mqttUrl: broker.url,
    });
    const tally = await sim.done;
    expect(sim.devices).toHaveLength(2);
    expect(tally).toMatchObject({ rejected: 0 });
    // Stored by the app's subscriber as the messages arrive: wait for them.
    for (const device of sim.devices) {
      await expect
        .poll(async () => (await rowsOf(device.sensorId, m)).length, { timeout: 30_000 })
        .toBeGreaterThanOrEqual(7 * 96);
      const rows = await rowsOf(device.sensorId, m);
      for (const row of rows) {
        const expected = simulatedReading(options.seed, device.series, new Date(row.taken_at).getTime())!;
        expect(Number(row.relative_humidity_pct)).toBe(expected.relativeHumidityPct);
        expect(Number(row.air_temperature_c)).toBe(expected.airTemperatureC);
      }
    }
    expect(subscriber.counts).toMatchObject({ refused: 0, badPayloads: 0, unknownSensors: 0, failedReadings: 0 });
  });
});
