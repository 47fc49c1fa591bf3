// Live-sensor benchmark (`npm run bench:sensors`), on its own throwaway MariaDB, its own mosquitto and
// the compiled app (`node dist-server/server/server.js`, as production runs it):
//
// 1. Sustained load: 50 000 sensors reporting every 15 minutes (≈ 56 readings a second, each sensor at
//    its own moment of the quarter hour), for 10 minutes over MQTT, then 10 minutes over HTTP. Each MQTT
//    device wakes, signs in with its own user name and secret, publishes its reading (QoS 1) and
//    disconnects, as battery sensors do (and 50 000 open connections would not fit the file limit);
//    each HTTP device posts its reading with its key. Reported: readings offered and stored per second,
//    the CPU share of the app, MariaDB and mosquitto (from /proc/<pid>/stat, in % of one core), and the
//    latency from the first reading published for a scripted room to that room's alert raised (p95).
//    The scripted rooms' week before the run is written straight into the table (the app is not told),
//    condensing throughout, so their first live reading is the one that raises the alert.
// 2. Backfill burst: 1 000 000 readings through the HTTP ingest (1 000 sensors × 1 000 readings, one
//    request each, 4 at a time), against LOAD DATA LOCAL INFILE of the same rows into the same table for
//    another 1 000 sensors, in the same run (LOAD DATA first, so the ingest meets the larger table). The
//    ingest runs twice, for two more sets of sensors: as CSV (the backlog form), then as JSON.
//
// Flags to shorten a trial: --sensors 5000 --minutes 1 --burst 100000 --rounds 1 --only mqtt,http,burst.
// The rate follows --sensors and --interval (sensors ÷ interval); the default is the full run.
import { spawn, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import { chmodSync, closeSync, openSync, readFileSync, writeSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import { parseArgs } from "node:util";
import mqtt from "mqtt";
import type { DataSource } from "typeorm";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { Property } from "../server/modules/properties/property.entity.js";
import { Room } from "../server/modules/properties/room.entity.js";
import { mosquittoPasswordHash } from "../server/modules/sensors/credentials.js";
import { MosquittoBrokerFiles, sensorReadingsTopic } from "../server/modules/sensors/mqtt/broker-files.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { createLogger } from "../server/lib/logger.js";
import { systemClock } from "../server/lib/clock.js";
import { startBenchDatabase } from "./lib/bench-database.js";
import { ensureSystemPackages, MOSQUITTO } from "./lib/system-packages.js";
import { freePort, loadDataConnection, rootSql, runningPid } from "./lib/mariadb.js";
import { startMosquitto, stopMosquitto } from "./lib/mosquitto.js";
import { stopChild, waitUntilReady } from "./lib/processes.js";
import { parseDuration, readingTimes, simulatedReading, type SeriesSensor, type SimulatedReading } from "./lib/sensor-series.js";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const SEED = 15;
const DAY = 86_400_000;
const fmt = (x: number, digits = 0) =>
  Number.isNaN(x) ? "n/a" : x.toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits });

const { values: args } = parseArgs({
  options: {
    sensors: { type: "string", default: "50000" },
    interval: { type: "string", default: "15m" },
    minutes: { type: "string", default: "10" },
    burst: { type: "string", default: "1000000" },
    "csv-per-request": { type: "string", default: "10000" },
    "json-per-request": { type: "string", default: "5000" },
    rounds: { type: "string", default: "4" },
    scripted: { type: "string", default: "20" },
    only: { type: "string", default: "mqtt,http,burst" },
  },
});
const SENSORS = Number(args.sensors);
const INTERVAL_S = Math.round(parseDuration(args.interval) / 1000);
const PHASE_MS = Number(args.minutes) * 60_000;
const BURST = Number(args.burst);
/** Readings a request in the burst: one sensor's backlog each (CSV takes larger batches than JSON). */
const PER_REQUEST = { csv: Number(args["csv-per-request"]), json: Number(args["json-per-request"]) };
const BURST_SENSORS = { csv: Math.ceil(BURST / PER_REQUEST.csv), json: Math.ceil(BURST / PER_REQUEST.json) };
/** LOAD DATA and the CSV ingest, this many times (which goes first alternates): the ratio is the median of the rounds. */
const ROUNDS = Number(args.rounds);
/** Sensors in the warm-up of each way in (a fifth of the burst's). */
const WARM_UP_SENSORS = Math.ceil(BURST_SENSORS.csv / 5);
const SCRIPTED = Number(args.scripted);
const ONLY = new Set(args.only.split(","));

/** Builds the server as `npm start` does (tsc → dist-server). */
function buildServer(): Promise<void> {
  return new Promise((resolve, reject) => {
    const proc = spawn(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], {
      cwd: root,
      stdio: "inherit",
    });
    proc.on("error", reject);
    proc.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`building the server failed (${code})`))));
  });
}

/** CPU time (user + system) of a process so far, in seconds, from /proc/<pid>/stat (clock ticks of 1/100 s). */
function cpuSeconds(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
  const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
  // After the command: state is field 3, so utime (14) and stime (15) are at 11 and 12 here.
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

const percentile = (values: number[], p: number) => {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
};

interface BenchSensor {
  id: number;
  roomId: number;
  username: string;
  secret: string;
  series: SeriesSensor;
}

const secretOf = (i: number) => `dws_${createHash("sha256").update(`bench-sensor-${i}`).digest("base64url")}`;

/**
 * One landlord, a home with two rooms for every two sensors, and the sensors with known secrets,
 * written in bulk (the registry's one-by-one registration would take hours for 50 000; this is the
 * registry's own shape: SHA-256 of the secret for HTTP, mosquitto's $7$ form for MQTT).
 */
async function seed(ds: DataSource, total: number): Promise<BenchSensor[]> {
  const org = await ds.getRepository(Organisation).save({ name: "Bench Sensors" });
  const homes = Math.ceil(total / 2);
  const roomIds: number[] = [];
  for (let start = 0; start < homes; start += 2000) {
    const batch = Array.from({ length: Math.min(2000, homes - start) }, (_, k) => ({
      organisationId: org.id,
      addressLine1: `${start + k + 1} Bench Street`,
      addressLine2: null,
      town: "Benchford",
      postcode: "ZX9 9ZZ",
      uprn: null,
      estate: "Bench Estate",
      block: null,
      builtForm: "mid-terrace" as const,
      wallType: "solid-brick" as const,
      glazingType: "old-double" as const,
      heatingType: "gas-boiler" as const,
    }));
    const inserted = await ds.getRepository(Property).insert(batch);
    const propertyIds = inserted.identifiers.map((x) => Number(x.id));
    const rooms = propertyIds.flatMap((propertyId) => [
      { propertyId, name: "Living room", kind: "living" as const },
      { propertyId, name: "Bedroom", kind: "bedroom" as const },
    ]);
    const insertedRooms = await ds.getRepository(Room).insert(rooms);
    roomIds.push(...insertedRooms.identifiers.map((x) => Number(x.id)));
  }
  const installedOn = new Date(Date.now() - 60 * DAY).toISOString().slice(0, 10);
  const rows: unknown[][] = [];
  for (let i = 0; i < total; i++) {
    const secret = secretOf(i);
    rows.push([
      org.id,
      0,
      roomIds[i]!,
      `BENCH-${String(i).padStart(6, "0")}`,
      "Bench TH-2S",
      "External wall corner",
      1,
      INTERVAL_S,
      installedOn,
      `tmp${i}`,
      createHash("sha256").update(secret).digest("hex"),
      mosquittoPasswordHash(secret),
      new Date(),
    ]);
  }
  for (let start = 0; start < rows.length; start += 5000) {
    await ds.query(
      `INSERT INTO sensors (organisation_id, property_id, room_id, serial, model, placement, measures_surface, interval_s,
         installed_on, mqtt_username, key_hash, mqtt_password_hash, key_issued_at) VALUES ?`,
      [rows.slice(start, start + 5000)],
    );
  }
  await ds.query(
    `UPDATE sensors s JOIN rooms r ON r.id = s.room_id SET s.property_id = r.property_id, s.mqtt_username = CONCAT('s', s.id)
      WHERE s.organisation_id = ?`,
    [org.id],
  );
  const stored = (await ds.query(
    `SELECT id, room_id AS roomId, mqtt_username AS username FROM sensors WHERE organisation_id = ? ORDER BY id`,
    [org.id],
  )) as { id: number; roomId: number; username: string }[];
  const installedAtMs = Date.parse(`${installedOn}T00:00:00Z`);
  return stored.map((s, i) => ({
    id: Number(s.id),
    roomId: Number(s.roomId),
    username: s.username,
    secret: secretOf(i),
    series: {
      serial: `BENCH-${String(i).padStart(6, "0")}`,
      home: `bench-${Math.floor(i / 2)}`,
      room: i % 2 === 0 ? "living" : "bedroom",
      temperatureFactor: 0.7,
      measuresSurface: true,
      intervalS: INTERVAL_S,
      installedAtMs,
      script: { kind: "normal" },
    },
  }));
}

/** The scripted rooms' week before the run, condensing throughout, written straight into the table. */
async function preloadScripted(ds: DataSource, sensors: BenchSensor[], untilMs: number) {
  for (const s of sensors) {
    s.series = {
      ...s.series,
      temperatureFactor: 0.55,
      script: { kind: "developing-condensation", fromMs: untilMs - 9 * DAY, days: 1 },
    };
    const rows = readingTimes(s.series, untilMs - 7 * DAY, untilMs - 60_000)
      .map((t) => simulatedReading(SEED, s.series, t)!)
      .map((r) => [
        s.id,
        new Date(r.takenAt),
        r.airTemperatureC,
        r.relativeHumidityPct,
        r.surfaceTemperatureC ?? null,
        r.batteryPct,
        new Date(),
      ]);
    await ds.query(
      `INSERT INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at) VALUES ?`,
      [rows],
    );
  }
}

interface PhaseResult {
  transport: "mqtt" | "http";
  seconds: number;
  offered: number;
  sent: number;
  failed: number;
  storedInPhase: number;
  storedAfterDrain: number;
  drainSeconds: number;
  cpu: { app: number; mariadb: number; mosquitto: number };
  latenciesMs: number[];
  scriptedWithoutAlert: number;
}

/**
 * When each scripted room's first alert was stored (`sensor_alerts.created_at`, the app clock: the end
 * of the latency), for alerts stored at or after `sinceMs`; null when the app has no alerts table.
 */
async function alertsRaised(ds: DataSource, roomIds: number[], sinceMs: number): Promise<Map<number, number> | null> {
  if (roomIds.length === 0) return new Map();
  try {
    const rows = (await ds.query(
      `SELECT room_id AS roomId, MIN(created_at) AS storedAt FROM sensor_alerts WHERE room_id IN (?) AND created_at >= ? GROUP BY room_id`,
      [roomIds, new Date(sinceMs)],
    )) as { roomId: number; storedAt: Date }[];
    return new Map(rows.map((r) => [Number(r.roomId), new Date(r.storedAt).getTime()]));
  } catch (error) {
    if ((error as { code?: string }).code === "ER_NO_SUCH_TABLE") return null;
    throw error;
  }
}

async function sustainedPhase(
  transport: "mqtt" | "http",
  ds: DataSource,
  sensors: BenchSensor[],
  scripted: BenchSensor[],
  pids: { app: number; mariadb: number; mosquitto: number },
  urls: { app: string; mqtt: string },
): Promise<PhaseResult> {
  // Each sensor reports at its own second of the interval: bucket them by that second.
  const buckets = new Map<number, BenchSensor[]>();
  for (const s of sensors) {
    const second = Math.floor(readingTimes(s.series, 0, INTERVAL_S * 1000)[0]! / 1000);
    const bucket = buckets.get(second);
    if (bucket) bucket.push(s);
    else buckets.set(second, [s]);
  }
  const scriptedIds = new Set(scripted.map((s) => s.id));
  const firstPublished = new Map<number, number>();
  let offered = 0;
  let sent = 0;
  let failed = 0;
  const pending = new Set<Promise<void>>();

  const send = async (s: BenchSensor, reading: SimulatedReading) => {
    const body = JSON.stringify({ readings: [reading] });
    const before = Date.now();
    if (transport === "mqtt") {
      const client = await mqtt.connectAsync(urls.mqtt, {
        username: s.username,
        password: s.secret,
        clientId: `bench-${s.username}`,
        protocolVersion: 5,
        reconnectPeriod: 0,
        connectTimeout: 30_000,
      });
      try {
        await client.publishAsync(sensorReadingsTopic(s.username), body, { qos: 1 });
      } finally {
        await client.endAsync();
      }
    } else {
      const res = await fetch(`${urls.app}/api/sensor-ingest/readings`, {
        method: "POST",
        headers: { "content-type": "application/json", authorization: `Bearer ${s.secret}` },
        body,
      });
      await res.arrayBuffer();
      if (!res.ok) throw new Error(`HTTP ${res.status}`);
    }
    if (scriptedIds.has(s.id) && !firstPublished.has(s.id)) firstPublished.set(s.id, before);
  };

  const cpuBefore = { app: cpuSeconds(pids.app), mariadb: cpuSeconds(pids.mariadb), mosquitto: cpuSeconds(pids.mosquitto) };
  const started = Date.now();
  const startedSecond = Math.ceil(started / 1000);
  for (let second = startedSecond; second * 1000 < started + PHASE_MS; second++) {
    const wait = second * 1000 - Date.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    for (const s of buckets.get(((second % INTERVAL_S) + INTERVAL_S) % INTERVAL_S) ?? []) {
      const reading = simulatedReading(SEED, s.series, second * 1000);
      if (!reading) continue;
      offered++;
      const p: Promise<void> = send(s, reading)
        .then(() => void sent++)
        .catch(() => void failed++)
        .finally(() => {
          pending.delete(p);
        });
      pending.add(p);
    }
  }
  const seconds = (Date.now() - started) / 1000;
  const cpuAfter = { app: cpuSeconds(pids.app), mariadb: cpuSeconds(pids.mariadb), mosquitto: cpuSeconds(pids.mosquitto) };
  const countSince = async () =>
    Number(
      (
        (await ds.query(`SELECT COUNT(*) AS n FROM sensor_readings WHERE received_at >= ?`, [new Date(started)])) as {
          n: number;
        }[]
      )[0]!.n,
    );
  const storedInPhase = await countSince();
  // Let what is in flight finish and be stored (at most a minute), then look for the alerts.
  const drainStart = Date.now();
  await Promise.all(pending);
  let storedAfterDrain = await countSince();
  while (storedAfterDrain < sent && Date.now() - drainStart < 60_000) {
    await new Promise((r) => setTimeout(r, 500));
    storedAfterDrain = await countSince();
  }
  const drainSeconds = (Date.now() - drainStart) / 1000;
  let raised: Map<number, number> | null = new Map();
  const roomIds = scripted.map((s) => s.roomId);
  const published = scripted.filter((s) => firstPublished.has(s.id)).length;
  while (Date.now() - drainStart < 90_000) {
    raised = await alertsRaised(ds, roomIds, started);
    if (raised === null || raised.size >= published) break;
    await new Promise((r) => setTimeout(r, 500));
  }
  const latenciesMs = scripted.flatMap((s) => {
    const at = raised?.get(s.roomId);
    const first = firstPublished.get(s.id);
    return at !== undefined && first !== undefined ? [at - first] : [];
  });
  const share = (k: keyof typeof cpuBefore) => (100 * (cpuAfter[k] - cpuBefore[k])) / seconds;
  return {
    transport,
    seconds,
    offered,
    sent,
    failed,
    storedInPhase,
    storedAfterDrain,
    drainSeconds,
    cpu: { app: share("app"), mariadb: share("mariadb"), mosquitto: share("mosquitto") },
    latenciesMs,
    scriptedWithoutAlert: raised === null ? Number.NaN : scripted.length - latenciesMs.length,
  };
}

type BurstFormat = "csv" | "json";

async function backfillBurst(
  ds: DataSource,
  db: Parameters<typeof loadDataConnection>[0],
  dir: string,
  sets: {
    warmUp: { load: BenchSensor[]; csv: BenchSensor[] };
    rounds: { load: BenchSensor[]; csv: BenchSensor[] }[];
    json: BenchSensor[];
  },
  appUrl: string,
  pids: { app: number; mariadb: number },
) {
  // Before each step InnoDB writes out the pages the last one changed, so that no step's timing carries
  // another's page flushing (1 000 000 rows leave ~100 MB of changed pages behind them).
  const instance = { dir: path.join(dir, "mariadb"), port: db.port };
  const settle = async () => {
    await rootSql(instance, "SET GLOBAL innodb_max_dirty_pages_pct_lwm = 0, GLOBAL innodb_max_dirty_pages_pct = 0");
    for (const deadline = performance.now() + 120_000; performance.now() < deadline;) {
      const dirty = Number(
        (
          await rootSql(
            instance,
            "SELECT VARIABLE_VALUE FROM information_schema.GLOBAL_STATUS WHERE VARIABLE_NAME = 'INNODB_BUFFER_POOL_PAGES_DIRTY'",
          )
        ).trim(),
      );
      if (dirty < 50) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    await rootSql(instance, "SET GLOBAL innodb_max_dirty_pages_pct_lwm = DEFAULT, GLOBAL innodb_max_dirty_pages_pct = DEFAULT");
  };
  // CPU seconds of the app, MariaDB and this script (the client) over a step.
  const cpuNow = () => ({
    app: cpuSeconds(pids.app),
    mariadb: cpuSeconds(pids.mariadb),
    client: (process.cpuUsage().user + process.cpuUsage().system) / 1e6,
  });
  const cpuSince = (before: ReturnType<typeof cpuNow>) => {
    const after = cpuNow();
    return { app: after.app - before.app, mariadb: after.mariadb - before.mariadb, client: after.client - before.client };
  };
  // Each sensor's backlog: one request's worth, every 15 minutes (closer when that would reach back
  // beyond 25 days: the ingest takes readings up to 30 days late), ending a day ago. LOAD DATA loads the
  // CSV's rows.
  const end = Date.now() - DAY;
  const template = { ...sets.json[0]!.series, script: { kind: "normal" as const } };
  const backlog = (perSensor: number) => {
    const spacingMs = Math.min(900_000, Math.floor((25 * DAY) / perSensor / 1000) * 1000);
    const times = Array.from({ length: perSensor }, (_, k) => Math.floor((end - (perSensor - k) * spacingMs) / 1000) * 1000);
    return times.map((t) => simulatedReading(SEED, template, t)!);
  };
  const readings = backlog(PER_REQUEST.csv);
  const jsonReadings = backlog(PER_REQUEST.json);
  const newestOf = (rs: typeof readings) => new Date(rs[rs.length - 1]!.takenAt);
  const bodies: Record<BurstFormat, { type: string; body: string; newest: Date }> = {
    csv: {
      type: "text/csv",
      newest: newestOf(readings),
      body:
        "takenAt,airTemperatureC,relativeHumidityPct,surfaceTemperatureC,batteryPct\n" +
        readings
          .map(
            (r) =>
              `${r.takenAt.replace(".000Z", "Z")},${r.airTemperatureC},${r.relativeHumidityPct},${r.surfaceTemperatureC ?? ""},${r.batteryPct}\n`,
          )
          .join(""),
    },
    json: { type: "application/json", body: JSON.stringify({ readings: jsonReadings }), newest: newestOf(jsonReadings) },
  };

  const loadData = async (sensors: BenchSensor[]) => {
    const file = path.join(dir, "burst.tsv");
    const fd = openSync(file, "w");
    const received = new Date().toISOString().replace("T", " ").replace("Z", "");
    for (const s of sensors) {
      let text = "";
      for (const r of readings) {
        text += `${s.id}\t${r.takenAt.replace("T", " ").replace(".000Z", "")}\t${r.airTemperatureC}\t${r.relativeHumidityPct}\t${r.surfaceTemperatureC ?? "\\N"}\t${r.batteryPct}\t${received}\n`;
      }
      writeSync(fd, text);
    }
    closeSync(fd);
    await settle();
    const loader = await loadDataConnection(db);
    try {
      const cpu0 = cpuNow();
      const t0 = performance.now();
      const [result] = (await loader.query({
        sql: `LOAD DATA LOCAL INFILE ? INTO TABLE sensor_readings FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n'
            (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at)`,
        values: [file],
      })) as unknown as [{ affectedRows: number }];
      const ms = performance.now() - t0;
      return { rows: result.affectedRows, ms, cpu: cpuSince(cpu0) };
    } finally {
      await loader.end();
    }
  };

  const ingest = async (format: BurstFormat, sensors: BenchSensor[]) => {
    const { type, newest } = bodies[format];
    // Encoded once, as a gateway holds its backlog as bytes: the client's work is then the sending.
    const body = Buffer.from(bodies[format].body);
    let stored = 0;
    let refused = 0;
    let retries = 0;
    let next = 0;
    await settle();
    const cpu0 = cpuNow();
    const t0 = performance.now();
    await Promise.all(
      Array.from({ length: 4 }, async () => {
        while (next < sensors.length) {
          const s = sensors[next++]!;
          // As a gateway would: a 503 (the app found the database too slow to answer) is tried again after its Retry-After.
          let res: Response;
          let answer: { stored?: number; refused?: unknown[] };
          for (let attempt = 1; ; attempt++) {
            res = await fetch(`${appUrl}/api/sensor-ingest/readings`, {
              method: "POST",
              headers: { "content-type": type, authorization: `Bearer ${s.secret}` },
              body,
            });
            answer = (await res.json()) as { stored?: number; refused?: unknown[] };
            if (res.status !== 503 || attempt === 5) break;
            retries++;
            await new Promise((r) => setTimeout(r, 1000 * Number(res.headers.get("retry-after") ?? 1)));
          }
          if (!res.ok) throw new Error(`the ingest answered ${res.status}: ${JSON.stringify(answer)}`);
          stored += answer.stored ?? 0;
          refused += answer.refused?.length ?? 0;
        }
      }),
    );
    const ms = performance.now() - t0;
    const cpu = cpuSince(cpu0);
    // The rooms' figures are worked out after the replies (a backfill's once the ingest is quiet): wait
    // for every burst room's figures to reach its newest reading, so that work is measured too (and is
    // over before the next step starts).
    const rooms = [...new Set(sensors.map((s) => s.roomId))];
    let figuresMs = Number.NaN;
    for (const deadline = performance.now() + 600_000; performance.now() < deadline;) {
      const [row] = (await ds.query(
        `SELECT COUNT(*) AS n FROM sensor_room_figures WHERE room_id IN (${rooms.map(() => "?").join(",")}) AND latest_reading_at >= ?`,
        [...rooms, newest],
      )) as { n: number | string }[];
      if (Number(row!.n) >= rooms.length) {
        figuresMs = performance.now() - t0;
        break;
      }
      await new Promise((r) => setTimeout(r, 250));
    }
    return { format, bytes: body.length * sensors.length, rows: stored, refused, retries, ms, cpu, figuresMs };
  };

  // Rounds of LOAD DATA and the CSV ingest, each on sensors of its own, so the ratio is measured side by
  // side more than once; then the JSON ingest once, for comparison.
  // A warm-up of both, not counted: the app's first requests run before its code is optimised.
  await loadData(sets.warmUp.load);
  await ingest("csv", sets.warmUp.csv);
  const rounds = [];
  for (const [k, round] of sets.rounds.entries()) {
    // Which goes first alternates: the second meets a table larger by a million rows.
    const loadFirst = k % 2 === 0;
    const load = loadFirst ? await loadData(round.load) : undefined;
    const csv = await ingest("csv", round.csv);
    const loaded = load ?? (await loadData(round.load));
    rounds.push({ loadFirst, load: loaded, csv, ratio: csv.rows / csv.ms / (loaded.rows / loaded.ms) });
  }
  const json = await ingest("json", sets.json);
  const lastLoad = rounds[rounds.length - 1]!.load;
  return { rounds, json, jsonRatio: json.rows / json.ms / (lastLoad.rows / lastLoad.ms) };
}

async function main() {
  await ensureSystemPackages([MOSQUITTO]);
  const building = buildServer();
  const bench = await startBenchDatabase("sensors");
  const { dir, db } = bench;
  // The bench's own connection, patient with long statements on a busy machine (the default stall check
  // takes a 5 000-row insert on a loaded machine for a database that stopped answering).
  await bench.ds.destroy();
  const ds = createDataSource({
    ...db,
    timeouts: { connectMs: 10_000, stallCheckMs: 10_000, queryMs: 600_000, acquireMs: 120_000 },
  });
  await ds.initialize();
  const brokerDir = path.join(dir, "mosquitto");
  let app: ChildProcess | undefined;
  try {
    // mosquitto drops to its own user before reading its files: it must be able to pass through the bench folder.
    chmodSync(dir, 0o711);
    const broker = await startMosquitto({ dir: brokerDir, port: await freePort() });
    const t0 = performance.now();
    const sensors = await seed(
      ds,
      SENSORS +
        2 * SCRIPTED +
        (ONLY.has("burst") ? 2 * WARM_UP_SENSORS + 2 * ROUNDS * BURST_SENSORS.csv + BURST_SENSORS.json : 0),
    );
    console.log(
      `Live-sensor benchmark — seeded ${fmt(sensors.length)} sensors in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
    );
    const live = sensors.slice(0, SENSORS);
    const scriptedMqtt = sensors.slice(SENSORS, SENSORS + SCRIPTED);
    const scriptedHttp = sensors.slice(SENSORS + SCRIPTED, SENSORS + 2 * SCRIPTED);
    const burstAt = SENSORS + 2 * SCRIPTED;
    const perRound = 2 * BURST_SENSORS.csv;
    const roundsAt = burstAt + 2 * WARM_UP_SENSORS;
    const burst = {
      warmUp: {
        load: sensors.slice(burstAt, burstAt + WARM_UP_SENSORS),
        csv: sensors.slice(burstAt + WARM_UP_SENSORS, roundsAt),
      },
      rounds: Array.from({ length: ROUNDS }, (_, k) => ({
        load: sensors.slice(roundsAt + k * perRound, roundsAt + k * perRound + BURST_SENSORS.csv),
        csv: sensors.slice(roundsAt + k * perRound + BURST_SENSORS.csv, roundsAt + (k + 1) * perRound),
      })),
      json: sensors.slice(roundsAt + ROUNDS * perRound),
    };

    const files = new MosquittoBrokerFiles(ds, { dir: brokerDir, ...broker.app }, createLogger("silent"), systemClock);
    await files.credentialsChanged();
    console.log(
      `  broker files for ${fmt(files.lastRewrite?.sensors ?? 0)} sensors rewritten in ${files.lastRewrite?.ms ?? "?"} ms`,
    );

    await building;
    const port = await freePort();
    const appUrl = `http://127.0.0.1:${port}`;
    app = spawn(
      process.execPath,
      [
        ...(process.env.BENCH_APP_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.BENCH_APP_PROF}`] : []),
        "dist-server/server/server.js",
      ],
      {
        cwd: root,
        stdio: ["ignore", "ignore", "inherit"],
        env: {
          ...process.env,
          NODE_ENV: "development",
          LOG_LEVEL: "warn",
          HOST: "127.0.0.1",
          PORT: String(port),
          APP_URL: appUrl,
          DB_HOST: db.host,
          DB_PORT: String(db.port),
          DB_NAME: db.name,
          DB_USER: db.user,
          DB_PASSWORD: db.password,
          MQTT_URL: broker.url,
          MQTT_USERNAME: broker.app.username,
          MQTT_PASSWORD: broker.app.password,
          MQTT_BROKER_DIR: brokerDir,
        },
      },
    );
    await waitUntilReady(`${appUrl}/api/health/ready`);
    const pids = { app: app.pid!, mariadb: runningPid(path.join(dir, "mariadb"))!, mosquitto: broker.pid };
    const rate = SENSORS / INTERVAL_S;
    console.log(
      `  ${fmt(SENSORS)} sensors every ${INTERVAL_S} s = ${fmt(rate, 1)} readings/s offered, ${args.minutes} min per transport; ` +
        `${SCRIPTED} scripted rooms per transport for the alert latency\n`,
    );

    const phases: PhaseResult[] = [];
    for (const transport of ["mqtt", "http"] as const) {
      if (!ONLY.has(transport)) continue;
      const scripted = transport === "mqtt" ? scriptedMqtt : scriptedHttp;
      await preloadScripted(ds, scripted, Date.now() + 5000);
      console.log(`  ${transport.toUpperCase()}: running…`);
      phases.push(await sustainedPhase(transport, ds, [...live, ...scripted], scripted, pids, { app: appUrl, mqtt: broker.url }));
    }
    if (phases.length > 0) {
      const row = (label: string, value: (p: PhaseResult) => string) =>
        console.log(`  ${label.padEnd(40)}${phases.map((p) => value(p).padStart(14)).join("")}`);
      console.log("");
      row("", (p) => p.transport.toUpperCase());
      row("seconds", (p) => fmt(p.seconds, 0));
      row("readings offered / s", (p) => fmt(p.offered / p.seconds, 1));
      row("sent (accepted by broker or app)", (p) => fmt(p.sent));
      row("failed to send", (p) => fmt(p.failed));
      row("stored / s during the phase", (p) => fmt(p.storedInPhase / p.seconds, 1));
      row("stored in all (after the drain)", (p) => `${fmt(p.storedAfterDrain)} (${fmt(p.drainSeconds, 1)} s)`);
      row("app CPU, % of one core", (p) => fmt(p.cpu.app, 1));
      row("MariaDB CPU, % of one core", (p) => fmt(p.cpu.mariadb, 1));
      row("mosquitto CPU, % of one core", (p) => fmt(p.cpu.mosquitto, 1));
      row("published → alert raised, p50 ms", (p) => fmt(percentile(p.latenciesMs, 50)));
      row("published → alert raised, p95 ms", (p) => fmt(percentile(p.latenciesMs, 95)));
      row("scripted rooms without an alert", (p) => fmt(p.scriptedWithoutAlert));
    }

    if (ONLY.has("burst")) {
      console.log(`\n  Backfill burst: ${fmt(BURST_SENSORS.csv * PER_REQUEST.csv)} readings…`);
      const b = await backfillBurst(ds, db, dir, burst, appUrl, pids);
      const head = `  ${"".padEnd(46)}${"rows".padStart(11)}${"MB sent".padStart(9)}${"seconds".padStart(9)}${"rows/s".padStart(10)}${"÷ LOAD".padStart(8)}`;
      const line = (label: string, r: { rows: number; ms: number; bytes?: number }, ratio: number) =>
        console.log(
          `  ${label.padEnd(46)}${fmt(r.rows).padStart(11)}${(r.bytes === undefined ? "" : fmt(r.bytes / 1e6)).padStart(9)}${fmt(r.ms / 1000, 1).padStart(9)}${fmt(r.rows / (r.ms / 1000)).padStart(10)}${ratio.toFixed(2).padStart(8)}`,
        );
      const cpu = (c: { app: number; mariadb: number; client: number }) =>
        `CPU s: app ${fmt(c.app, 1)}, MariaDB ${fmt(c.mariadb, 1)}, client ${fmt(c.client, 1)}`;
      console.log(head);
      b.rounds.forEach((r, k) => {
        const load = () => line(`round ${k + 1}: LOAD DATA LOCAL INFILE (one statement)`, r.load, 1);
        if (r.loadFirst) load();
        line(`round ${k + 1}: HTTP ingest, CSV (${fmt(PER_REQUEST.csv)} a request)`, r.csv, r.ratio);
        if (!r.loadFirst) load();
        console.log(
          `      LOAD DATA ${cpu(r.load.cpu)}; CSV ${cpu(r.csv.cpu)}; figures current ${fmt(r.csv.figuresMs / 1000, 1)} s after the first request`,
        );
      });
      line(`HTTP ingest, JSON (${fmt(PER_REQUEST.json)} a request)`, b.json, b.jsonRatio);
      console.log(`      JSON ${cpu(b.json.cpu)}; figures current ${fmt(b.json.figuresMs / 1000, 1)} s after the first request`);
      const refused = b.rounds.reduce((n, r) => n + r.csv.refused, b.json.refused);
      const retries = b.rounds.reduce((n, r) => n + r.csv.retries, b.json.retries);
      const ratios = b.rounds.map((r) => r.ratio).sort((x, y) => x - y);
      console.log(`  refused ${refused}; requests tried again after a 503: ${retries}; 4 requests at once throughout`);
      console.log(
        `  CSV ingest ÷ LOAD DATA, median of ${ratios.length} rounds: ${percentile(ratios, 50).toFixed(2)}× (target ≥ 0.8×); JSON ÷ the last LOAD DATA: ${b.jsonRatio.toFixed(2)}×`,
      );
    }
  } finally {
    if (app) await stopChild(app, 30_000);
    await stopMosquitto(brokerDir).catch(() => undefined);
    await ds.destroy().catch(() => undefined);
    await bench.stop();
  }
}

await main();
