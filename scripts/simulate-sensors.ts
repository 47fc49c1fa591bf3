// `npm run simulate:sensors -- --homes 500 --interval 15m --speed 60 [--transport mqtt|http|both]
//   [--backfill 7d] [--lead 6h] [--landlord "<name>"] [--seed n] [--duration 10m] [--verbose]`
//
// Fits simulated sensors in a landlord's homes (the demo landlord unless --landlord names another),
// registered through the sensor registry as one of the landlord's admins, each with its own secret,
// and sends their readings (scripts/lib/sensor-series.ts) to the running app: over MQTT with each
// device's own user name and password, and over HTTP with its key. The first five homes carry the
// scripted stories (condensation developing, a leak, a dead, a drifting and a stuck sensor).
//
// Time: the app refuses readings from the future, so a simulation faster than real time runs behind
// it. The simulated clock starts `--lead` before now (6 h by default when --speed > 1) and runs at
// --speed until it has caught up with real time, then goes on at real time. `--backfill` sends the
// period before that at once, in batches, as a gateway catching up would; the scripted stories begin
// with the backfill. Runs until Ctrl-C (or --duration of real time), then closes everything.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import mqtt, { type MqttClient } from "mqtt";
import { loadConfig, type Config } from "../server/config/env.js";
import { createAppContext, type AppContext } from "../server/app-context.js";
import type { Actor } from "../server/lib/actor.js";
import { systemClock, type Clock } from "../server/lib/clock.js";
import { DEMO_ORGANISATION } from "../server/db/seeds/demo.js";
import { brokerPaths } from "../server/modules/sensors/mqtt/broker-files.js";
import { SENSOR_BATCH_MAX } from "../src/lib/schemas/sensor-readings.js";
import {
  parseDuration,
  plannedSensors,
  readingTimes,
  simulatedReading,
  type SeriesRoomKind,
  type SeriesSensor,
  type SimulatedReading,
} from "./lib/sensor-series.js";
import { projectRoot } from "./lib/paths.js";

export type Transport = "mqtt" | "http";

export interface SimulationOptions {
  homes: number;
  intervalS: number;
  speed: number;
  transport: Transport | "both";
  backfillMs: number;
  leadMs: number;
  seed: number;
  /** The landlord's name (default: the demo landlord). */
  landlord: string;
  /** Where the app answers (`http://127.0.0.1:3000`) and the broker (`mqtt://127.0.0.1:1883`). */
  appUrl: string;
  mqttUrl: string;
  /** Stop after this much real time (default: run until stopped). */
  durationMs?: number;
  verbose: boolean;
  log: (line: string) => void;
  /** "Now" (the app's clock when run beside it in a test). */
  clock: Clock;
}

export interface SimulatedDevice {
  sensorId: number;
  serial: string;
  mqttUsername: string;
  secret: string;
  transport: Transport;
  series: SeriesSensor;
}

export interface SendTally {
  sent: number;
  stored: number;
  duplicates: number;
  refused: number;
  /** Publishes or posts the broker or the app refused outright (not per reading). */
  rejected: number;
}

const DAY = 86_400_000;

const toRoomKind = (kind: string): SeriesRoomKind =>
  kind === "living" || kind === "kitchen" || kind === "bathroom" || kind === "bedroom" ? kind : "other";

interface LandlordHomes {
  actor: Actor;
  homes: { id: number; rooms: { id: number; kind: SeriesRoomKind }[] }[];
}

/** The landlord's first admin (who registers the sensors) and its first `count` homes with their rooms. */
async function landlordHomes(ctx: AppContext, landlord: string, count: number): Promise<LandlordHomes> {
  const ds = ctx.dataSource;
  const [admin] = (await ds.query(
    `SELECT u.id, u.email, u.name, u.role, u.organisation_id AS organisationId
       FROM users u JOIN organisations o ON o.id = u.organisation_id
      WHERE o.name = ? AND u.role = 'admin' AND u.status = 'active'
      ORDER BY u.id LIMIT 1`,
    [landlord],
  )) as Actor[];
  if (!admin) throw new Error(`No landlord "${landlord}" with an active admin account (run npm run seed for the demo).`);
  const actor: Actor = { ...admin, id: Number(admin.id), organisationId: Number(admin.organisationId) };
  const homeRows = (await ds.query(`SELECT id FROM properties WHERE organisation_id = ? ORDER BY id LIMIT ?`, [
    actor.organisationId,
    count,
  ])) as { id: number }[];
  if (homeRows.length === 0) throw new Error(`${landlord} has no homes.`);
  const ids = homeRows.map((h) => Number(h.id));
  const roomRows = (await ds.query(`SELECT id, property_id AS propertyId, kind FROM rooms WHERE property_id IN (?) ORDER BY id`, [
    ids,
  ])) as { id: number; propertyId: number; kind: string }[];
  const homes = ids.map((id) => ({
    id,
    rooms: roomRows.filter((r) => Number(r.propertyId) === id).map((r) => ({ id: Number(r.id), kind: toRoomKind(r.kind) })),
  }));
  return { actor, homes: homes.filter((h) => h.rooms.length > 0) };
}

/**
 * Registers the simulated sensors through the registry (or issues a new secret to one registered by
 * an earlier run: secrets are shown once and never kept), and returns each device with its secret.
 */
export async function fitSimulatedSensors(
  ctx: AppContext,
  options: SimulationOptions,
  defaultStoryStartMs: number,
): Promise<{ devices: SimulatedDevice[]; storyStartMs: number }> {
  const { actor, homes } = await landlordHomes(ctx, options.landlord, options.homes);
  if (homes.length < options.homes) options.log(`${options.landlord} has ${homes.length} homes with rooms; simulating those.`);
  const devices: SimulatedDevice[] = [];
  // Sensors fitted by an earlier run keep their stories' dates (fitted 60 days before the story began),
  // so a restarted demo carries on where it was rather than starting its stories again.
  const firstHome = homes[0] ? await ctx.services.sensors.listForHome(actor, homes[0].id) : [];
  const earlier = firstHome.find((v) => v.sensor.serial.startsWith(`SIM-00001-`));
  // Stories start at a midnight (UTC), so the date kept says exactly when.
  const storyStartMs = earlier
    ? Date.parse(`${earlier.sensor.installedOn}T00:00:00Z`) + 60 * DAY
    : Math.floor(defaultStoryStartMs / DAY) * DAY;
  const installedOn = new Date(storyStartMs - 60 * DAY).toISOString().slice(0, 10);
  for (const [index, home] of homes.entries()) {
    const existing = index === 0 ? firstHome : await ctx.services.sensors.listForHome(actor, home.id);
    for (const plan of plannedSensors(index, storyStartMs)) {
      const room = home.rooms.find((r) => r.kind === plan.room) ?? home.rooms[0]!;
      const serial = `SIM-${String(index + 1).padStart(5, "0")}-${plan.room}`;
      const found = existing.find((v) => v.sensor.serial === serial);
      const { view, secret } = found
        ? await ctx.services.sensors.issue(actor, found.sensor.id)
        : await ctx.services.sensors.register(actor, {
            propertyId: home.id,
            roomId: room.id,
            serial,
            model: plan.model,
            placement: plan.placement,
            measuresSurface: plan.measuresSurface,
            intervalS: options.intervalS,
            installedOn,
          });
      const transport: Transport =
        options.transport === "both" ? (devices.length % 2 === 0 ? "mqtt" : "http") : options.transport;
      devices.push({
        sensorId: view.sensor.id,
        serial,
        mqttUsername: view.sensor.mqttUsername,
        secret,
        transport,
        series: {
          serial,
          home: `home-${home.id}`,
          room: plan.room,
          temperatureFactor: plan.temperatureFactor,
          measuresSurface: plan.measuresSurface,
          intervalS: view.sensor.intervalS,
          installedAtMs: Date.parse(`${installedOn}T00:00:00Z`),
          script: plan.script,
        },
      });
    }
  }
  return { devices, storyStartMs };
}

/** Posts one batch over HTTP with the device's key; adds the app's answer to the tally and logs refusals. */
async function postBatch(options: SimulationOptions, device: SimulatedDevice, readings: SimulatedReading[], tally: SendTally) {
  tally.sent += readings.length;
  const res = await fetch(`${options.appUrl}/api/sensor-ingest/readings`, {
    method: "POST",
    headers: { "content-type": "application/json", authorization: `Bearer ${device.secret}` },
    body: JSON.stringify({ serial: device.serial, readings }),
  }).catch((error: unknown) => ({ ok: false as const, status: 0, error }));
  if (!("json" in res)) {
    tally.rejected++;
    options.log(`${device.serial} http: no answer (${String(res.error)})`);
    return;
  }
  const body = (await res.json().catch(() => null)) as {
    stored?: number;
    duplicates?: number;
    refused?: { takenAt: string | null; reason: string }[];
    error?: { message: string };
  } | null;
  if (!res.ok || !body) {
    tally.rejected++;
    options.log(`${device.serial} http: ${res.status} ${body?.error?.message ?? ""}`);
    return;
  }
  tally.stored += body.stored ?? 0;
  tally.duplicates += body.duplicates ?? 0;
  for (const r of body.refused ?? []) {
    tally.refused++;
    options.log(`${device.serial} http: refused ${r.takenAt ?? "?"}: ${r.reason}`);
  }
}

/**
 * One MQTT connection per device, signed in as the device (MQTT 5, so a refused publish is reported).
 * A device whose connection is refused, or finds no broker, sends over HTTP instead (said once each).
 */
async function connectDevices(options: SimulationOptions, devices: SimulatedDevice[]): Promise<Map<number, MqttClient>> {
  const clients = new Map<number, MqttClient>();
  const mqttDevices = devices.filter((d) => d.transport === "mqtt");
  for (let i = 0; i < mqttDevices.length; i += 50) {
    await Promise.all(
      mqttDevices.slice(i, i + 50).map(async (d) => {
        try {
          const client = await mqtt.connectAsync(
            options.mqttUrl,
            {
              username: d.mqttUsername,
              password: d.secret,
              clientId: `sim-${d.mqttUsername}`,
              protocolVersion: 5,
              reconnectPeriod: 5000,
              connectTimeout: 10_000,
            },
            // Fail at once when there is no broker (rather than retrying forever before the first connection).
            false,
          );
          client.on("error", (error) => options.log(`${d.serial} mqtt: ${error.message}`));
          clients.set(d.sensorId, client);
        } catch (error) {
          d.transport = "http";
          options.log(
            `${d.serial} mqtt: could not connect to ${options.mqttUrl} (${error instanceof Error ? error.message : String(error)}); sending over HTTP instead.`,
          );
        }
      }),
    );
  }
  return clients;
}

async function publishBatch(
  options: SimulationOptions,
  client: MqttClient,
  device: SimulatedDevice,
  readings: SimulatedReading[],
  tally: SendTally,
) {
  tally.sent += readings.length;
  try {
    await client.publishAsync(`sensors/${device.mqttUsername}/readings`, JSON.stringify({ serial: device.serial, readings }), {
      qos: 1,
    });
  } catch (error) {
    tally.rejected++;
    options.log(`${device.serial} mqtt: ${error instanceof Error ? error.message : String(error)}`);
  }
}

async function sendBatch(
  options: SimulationOptions,
  clients: Map<number, MqttClient>,
  device: SimulatedDevice,
  readings: SimulatedReading[],
  tally: SendTally,
) {
  if (options.verbose) {
    for (const r of readings)
      options.log(
        `${device.serial} ${device.transport} ${r.takenAt} ${r.airTemperatureC} °C ${r.relativeHumidityPct} %` +
          (r.surfaceTemperatureC === undefined ? "" : ` surface ${r.surfaceTemperatureC} °C`) +
          ` battery ${r.batteryPct} %`,
      );
  }
  const client = clients.get(device.sensorId);
  if (client) await publishBatch(options, client, device, readings, tally);
  else await postBatch(options, device, readings, tally);
}

/** Runs `work` over the items, `concurrency` at a time. */
async function eachLimited<T>(items: T[], concurrency: number, work: (item: T) => Promise<void>) {
  let next = 0;
  await Promise.all(
    Array.from({ length: Math.min(concurrency, items.length) }, async () => {
      while (next < items.length) await work(items[next++]!);
    }),
  );
}

const newTally = (): SendTally => ({ sent: 0, stored: 0, duplicates: 0, refused: 0, rejected: 0 });
const describe = (t: SendTally) =>
  `sent ${t.sent}, stored ${t.stored} (HTTP answers; MQTT is stored by the app's subscriber), duplicates ${t.duplicates}, ` +
  `refused ${t.refused}, publishes/posts refused ${t.rejected}`;

export interface Simulation {
  devices: SimulatedDevice[];
  /** Resolves when the simulation has stopped (by stop() or --duration). */
  done: Promise<SendTally>;
  stop(): Promise<void>;
}

/** Fits the sensors, sends the backfill, then runs live until stopped. */
export async function startSimulation(ctx: AppContext, options: SimulationOptions): Promise<Simulation> {
  const now = () => options.clock.now().getTime();
  const now0 = now();
  const liveFromMs = Math.floor((now0 - options.leadMs) / 1000) * 1000;
  const backfillFromMs = liveFromMs - options.backfillMs;
  const { devices } = await fitSimulatedSensors(ctx, options, backfillFromMs);
  const counts = {
    mqtt: devices.filter((d) => d.transport === "mqtt").length,
    http: devices.filter((d) => d.transport === "http").length,
  };
  options.log(
    `${devices.length} sensors in ${new Set(devices.map((d) => d.series.home)).size} homes (${counts.mqtt} over MQTT, ${counts.http} over HTTP), ` +
      `every ${options.intervalS} s of simulated time.`,
  );
  const clients = await connectDevices(options, devices);

  const total = newTally();
  const add = (t: SendTally) => {
    for (const k of Object.keys(t) as (keyof SendTally)[]) total[k] += t[k];
  };
  if (options.backfillMs > 0) {
    const tally = newTally();
    const started = now();
    await eachLimited(devices, 4, async (device) => {
      const times = readingTimes(device.series, backfillFromMs, liveFromMs);
      const readings = times.map((t) => simulatedReading(options.seed, device.series, t)).filter((r) => r !== null);
      for (let i = 0; i < readings.length; i += SENSOR_BATCH_MAX)
        await sendBatch({ ...options, verbose: false }, clients, device, readings.slice(i, i + SENSOR_BATCH_MAX), tally);
    });
    options.log(
      `Backfill ${new Date(backfillFromMs).toISOString()} → ${new Date(liveFromMs).toISOString()}: ${describe(tally)} in ${((now() - started) / 1000).toFixed(1)} s.`,
    );
    add(tally);
  }

  // Live: each second, every reading whose time the simulated clock has passed since the last tick.
  const liveStartedAt = now();
  const simulatedNow = () => Math.min(now(), liveFromMs + options.speed * (now() - liveStartedAt));
  let nextFrom = liveFromMs;
  let caughtUp = options.leadMs === 0;
  let running = true;
  let tally = newTally();
  let lastReport = now();
  let resolveDone!: (t: SendTally) => void;
  const done = new Promise<SendTally>((r) => (resolveDone = r));
  const loop = (async () => {
    while (running) {
      // Up to and including the simulated clock's current second.
      const upTo = Math.floor(simulatedNow() / 1000) * 1000 + 1;
      const due = devices
        .map((device) => ({
          device,
          readings: readingTimes(device.series, nextFrom, upTo)
            .map((t) => simulatedReading(options.seed, device.series, t))
            .filter((r) => r !== null),
        }))
        .filter((d) => d.readings.length > 0);
      nextFrom = upTo;
      await eachLimited(due, 16, (d) => sendBatch(options, clients, d.device, d.readings, tally));
      if (!caughtUp && nextFrom >= now() - 2000) {
        caughtUp = true;
        options.log("Caught up with real time: now sending at real time.");
      }
      if (now() - lastReport >= 10_000) {
        options.log(`${new Date(nextFrom - 1).toISOString()} (simulated): ${describe(tally)}.`);
        add(tally);
        tally = newTally();
        lastReport = now();
      }
      if (options.durationMs !== undefined && now() - liveStartedAt >= options.durationMs) break;
      await new Promise((r) => setTimeout(r, 1000));
    }
  })();
  let finishing: Promise<void> | null = null;
  const finish = () =>
    (finishing ??= (async () => {
      running = false;
      await loop;
      add(tally);
      await Promise.all([...clients.values()].map((c) => c.endAsync().catch(() => undefined)));
      resolveDone(total);
    })());
  void loop.then(finish);
  return { devices, done, stop: finish };
}

function optionsFromArgs(config: Config, argv: string[]): SimulationOptions {
  const { values } = parseArgs({
    args: argv,
    options: {
      homes: { type: "string", default: "10" },
      interval: { type: "string", default: "15m" },
      speed: { type: "string", default: "1" },
      transport: { type: "string", default: "both" },
      backfill: { type: "string", default: "0" },
      lead: { type: "string" },
      landlord: { type: "string", default: DEMO_ORGANISATION },
      seed: { type: "string", default: "20261205" },
      duration: { type: "string" },
      "app-url": { type: "string" },
      "mqtt-url": { type: "string" },
      verbose: { type: "boolean", default: false },
    },
  });
  const speed = Number(values.speed);
  if (!(speed >= 1)) throw new Error("--speed must be 1 or more");
  const homes = Number(values.homes);
  if (!Number.isInteger(homes) || homes < 1) throw new Error("--homes must be a whole number of homes");
  if (!["mqtt", "http", "both"].includes(values.transport)) throw new Error("--transport is mqtt, http or both");
  const local = config.host === "0.0.0.0" || config.host === "::" ? "127.0.0.1" : config.host;
  return {
    homes,
    intervalS: Math.round(parseDuration(values.interval) / 1000),
    speed,
    transport: values.transport as SimulationOptions["transport"],
    backfillMs: parseDuration(values.backfill),
    leadMs: values.lead !== undefined ? parseDuration(values.lead) : speed > 1 ? parseDuration("6h") : 0,
    seed: Number(values.seed),
    landlord: values.landlord,
    appUrl: values["app-url"] ?? `http://${local}:${config.port}`,
    mqttUrl: values["mqtt-url"] ?? config.mqtt.url,
    ...(values.duration !== undefined ? { durationMs: parseDuration(values.duration) } : {}),
    verbose: values.verbose,
    log: (line) => console.log(line),
    clock: systemClock,
  };
}

/**
 * The broker `npm start` runs (.data/mosquitto): when the environment names no broker folder, the
 * simulator keeps that one's password file in step, so its new devices may sign in at once.
 */
function environmentWithLocalBroker(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  if (env.MQTT_BROKER_DIR) return env;
  const dir = path.join(projectRoot, ".data", "mosquitto");
  const { appPassword } = brokerPaths(dir);
  if (!existsSync(appPassword)) return env;
  return { ...env, MQTT_BROKER_DIR: dir, MQTT_PASSWORD: readFileSync(appPassword, "utf8").trim() };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const config = loadConfig(environmentWithLocalBroker(process.env));
  const options = optionsFromArgs(config, process.argv.slice(2));
  const ctx = await createAppContext(config);
  const simulation = await startSimulation(ctx, options);
  const stop = () => void simulation.stop();
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  const total = await simulation.done;
  console.log(`Stopped. In all: ${describe(total)}.`);
  await ctx.close();
}
