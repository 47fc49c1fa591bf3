// `npm run explain:readings [-- --readings N]`: the queries the app makes on sensor readings, explained
// at scale. A throwaway MariaDB, migrated (so sensor_readings is partitioned by month), is seeded with N
// readings (50 000 000 by default) at 15-minute intervals over the last 24 months, across as many sensors
// as that takes (two to a home), plus a case's hand readings; then each query the services issue is run
// through ANALYZE FORMAT=JSON and printed with its plan, the partitions it touched, the rows it examined
// and its time (best of three runs). Use --readings 2000000 for a quick try. Stops and removes it all at
// the end. Seed values are our own fiction.
import { closeSync, openSync, rmSync, writeSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import type { Clock } from "../server/lib/clock.js";
import { monthOf, monthStart } from "../server/modules/sensors/reading-months.js";
import { ReadingPartitionService } from "../server/modules/sensors/reading-partitions.service.js";
import { SensorIngestService } from "../server/modules/sensors/sensor-ingest.service.js";
import { startBenchDatabase } from "./lib/bench-database.js";
import { loadDataConnection } from "./lib/mariadb.js";

const { values } = parseArgs({ args: process.argv.slice(2), options: { readings: { type: "string" } } });
const total = Number(values.readings ?? 50_000_000);
if (!Number.isInteger(total) || total < 1_000_000) {
  console.error("usage: npm run explain:readings [-- --readings N]  (N a whole number, at least 1000000)");
  process.exit(2);
}

const INTERVAL_S = 900;
const MONTHS = 24;
/** The end of the seeded series: a fixed instant, on the hour, so runs compare. */
const now = new Date(Math.floor(Date.now() / 3_600_000) * 3_600_000);
const clock: Clock = { now: () => now };
const start = monthStart(monthOf(now) - (MONTHS - 1));
const perSensorMax = Math.floor((now.getTime() - start.getTime()) / 1000 / INTERVAL_S);
const sensors = Math.max(10, Math.ceil(total / perSensorMax));
const perSensor = Math.floor(total / sensors);
const CASES = 2000;
const CASE_READINGS = 150;

const sqlTime = (ms: number) => new Date(ms).toISOString().slice(0, 19).replace("T", " ");
const secs = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

const bench = await startBenchDatabase("explain-readings");
const { ds, db, dir } = bench;
try {
  const t0 = performance.now();
  const partitions = new ReadingPartitionService(ds, clock);
  await partitions.ensureFrom(monthOf(start));
  await partitions.ensureAhead();

  // Sensors: two to a home, one to a room; active, with a key (the ingest's duplicate check runs on sensor 1).
  const sensorRows = Array.from({ length: sensors }, (_, i) => [
    1,
    1 + Math.floor(i / 2),
    1 + i,
    `EX-${String(i + 1).padStart(6, "0")}`,
    "Example logger",
    i % 2 ? "on the wall behind the wardrobe" : "beside the window",
    i % 3 === 0 ? 1 : 0,
    sqlTime(start.getTime()).slice(0, 10),
    `ex-${i + 1}`,
    (i + 1).toString(16).padStart(64, "0"),
  ]);
  for (let i = 0; i < sensorRows.length; i += 1000) {
    await ds.query(
      "INSERT INTO sensors (organisation_id, property_id, room_id, serial, model, placement, measures_surface, installed_on, mqtt_username, key_hash) VALUES ?",
      [sensorRows.slice(i, i + 1000)],
    );
  }

  // Readings in key order (sensor, then time), so each partition's key is appended to, in files of ~1M rows.
  // Each sensor's series ends one interval before "now", as a live one would.
  const newest = now.getTime() - INTERVAL_S * 1000;
  const times = Array.from({ length: perSensor }, (_, k) => sqlTime(newest - (perSensor - 1 - k) * INTERVAL_S * 1000));
  const received = sqlTime(newest) + ".000";
  const file = path.join(dir, "seed.tsv");
  const loader = await loadDataConnection(db);
  let loaded = 0;
  let lastReport = performance.now();
  try {
    await loader.query("SET SESSION unique_checks = 0, foreign_key_checks = 0");
    let fd = openSync(file, "w");
    let inFile = 0;
    const flush = async () => {
      closeSync(fd);
      await loader.query({
        sql: `LOAD DATA LOCAL INFILE ? INTO TABLE sensor_readings FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n'
            (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at)`,
        values: [file],
      });
      loaded += inFile;
      inFile = 0;
      fd = openSync(file, "w");
      if (performance.now() - lastReport > 30_000) {
        lastReport = performance.now();
        console.log(`  seeded ${loaded.toLocaleString("en-GB")} readings (${secs(performance.now() - t0)})`);
      }
    };
    for (let s = 1; s <= sensors; s++) {
      const lines: string[] = [];
      for (let k = 0; k < perSensor; k++) {
        // A daily swing and a slow drift: plausible indoor air, values our own.
        const day = Math.sin((k / 96) * 2 * Math.PI + s);
        const air = (18.5 + 2.5 * day + ((s * 7) % 10) / 10).toFixed(2);
        const rh = (62 - 9 * day + ((k * 13 + s) % 17) / 4).toFixed(2);
        const surface = s % 3 === 1 ? (15 + 2 * day).toFixed(2) : "\\N";
        lines.push(`${s}\t${times[k]}\t${air}\t${rh}\t${surface}\t${90 - Math.floor(k / 2000)}\t${received}`);
      }
      writeSync(fd, lines.join("\n") + "\n");
      inFile += perSensor;
      if (inFile >= 1_000_000) await flush();
    }
    if (inFile > 0) await flush();
    closeSync(fd);

    // A case's hand readings (the case page): CASES cases of CASE_READINGS readings in three rooms each.
    fd = openSync(file, "w");
    for (let c = 1; c <= CASES; c++) {
      const lines: string[] = [];
      for (let k = 0; k < CASE_READINGS; k++) {
        lines.push(`${c}\t${c * 3 + (k % 3)}\t${times[perSensor - 1 - k * 24]}\t19.50\t71.00\t\\N\t\\N\tmanual`);
      }
      writeSync(fd, lines.join("\n") + "\n");
    }
    closeSync(fd);
    await loader.query({
      sql: `LOAD DATA LOCAL INFILE ? INTO TABLE readings FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n'
          (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source)`,
      values: [file],
    });
  } finally {
    await loader.end();
    rmSync(file, { force: true });
  }
  await ds.query("UPDATE sensors SET last_reading_at = ?", [sqlTime(newest)]);
  await ds.query("ANALYZE TABLE sensor_readings, readings, sensors");
  const seeded = performance.now() - t0;
  // Counted as loaded: a COUNT(*) of 50 M rows outlasts the data source's 30-second query limit.
  const n = loaded;
  const parts = await partitions.partitions();
  console.log(
    `\nSeeded ${Number(n).toLocaleString("en-GB")} sensor readings (${sensors} sensors × ${perSensor} at 15 min, ` +
      `${parts.length} partitions) and ${CASES * CASE_READINGS} hand readings in ${secs(seeded)}.\n`,
  );

  // The app's queries, with the values its services would bind (constants, as mysql2 sends them).
  const at = (ms: number) => new Date(ms);
  const DAY = 86_400_000;
  const sensorId = Math.ceil(sensors / 2);
  const batch = Array.from({ length: Math.min(200, sensors) }, (_, i) => i + 1);
  const queries: { name: string; sql: string; params: unknown[] }[] = [
    {
      name: "room watch, before the fix: 30 days back from the newest reading (one statement, MAX subquery)",
      sql: `SELECT r.taken_at AS at, r.air_temperature_c AS airT, r.relative_humidity_pct AS rh, r.surface_temperature_c AS surfaceT
              FROM sensor_readings r WHERE r.sensor_id = ?
               AND r.taken_at >= (SELECT MAX(taken_at) FROM sensor_readings WHERE sensor_id = ?) - INTERVAL ? DAY ORDER BY r.taken_at`,
      params: [sensorId, sensorId, 30],
    },
    {
      name: "room watch (SensorIngestService.recentReadings) 1/2: the sensor's newest reading",
      sql: "SELECT MAX(taken_at) AS at FROM sensor_readings WHERE sensor_id = ?",
      params: [sensorId],
    },
    {
      name: "room watch 2/2: its 30 days (the room's mould history)",
      sql: `SELECT r.taken_at AS at, r.air_temperature_c AS airT, r.relative_humidity_pct AS rh, r.surface_temperature_c AS surfaceT
              FROM sensor_readings r WHERE r.sensor_id = ? AND r.taken_at >= ? AND r.taken_at <= ? ORDER BY r.taken_at`,
      params: [sensorId, at(newest - 30 * DAY), at(newest)],
    },
    {
      name: "sensor health sweep: 200 sensors' last 24 hours",
      sql: `SELECT sensor_id AS sensorId, taken_at AS takenAt, air_temperature_c AS airTemperatureC,
                   relative_humidity_pct AS relativeHumidityPct, surface_temperature_c AS surfaceTemperatureC, battery_pct AS batteryPct
              FROM sensor_readings WHERE sensor_id IN (?) AND taken_at > ? AND taken_at <= ? ORDER BY sensor_id, taken_at`,
      params: [batch, at(now.getTime() - DAY), now],
    },
    {
      name: "one sensor's health (its page): its last 24 hours",
      sql: `SELECT sensor_id AS sensorId, taken_at AS takenAt, air_temperature_c AS airTemperatureC,
                   relative_humidity_pct AS relativeHumidityPct, surface_temperature_c AS surfaceTemperatureC, battery_pct AS batteryPct
              FROM sensor_readings WHERE sensor_id IN (?) AND taken_at > ? AND taken_at <= ? ORDER BY sensor_id, taken_at`,
      params: [[sensorId], at(now.getTime() - DAY), now],
    },
    {
      name: "tenant's outlook, before the fix: a home's rooms over the last 24 hours, readings joined from sensors",
      sql: `SELECT s.room_id AS roomId, MAX(r.taken_at) AS takenAt, AVG(r.air_temperature_c) AS air, AVG(r.relative_humidity_pct) AS rh
              FROM sensors s JOIN sensor_readings r ON r.sensor_id = s.id AND r.taken_at >= ?
             WHERE s.property_id = ? AND s.removed_on IS NULL GROUP BY s.room_id`,
      params: [at(now.getTime() - DAY), Math.ceil(sensorId / 2)],
    },
    {
      name: "tenant's outlook (SensorService.recentByRoom) 1/2: the home's sensors",
      sql: "SELECT id FROM sensors WHERE property_id = ? AND removed_on IS NULL",
      params: [Math.ceil(sensorId / 2)],
    },
    {
      name: "tenant's outlook 2/2: their rooms over the last 24 hours",
      sql: `SELECT s.room_id AS roomId, MAX(r.taken_at) AS takenAt, AVG(r.air_temperature_c) AS air, AVG(r.relative_humidity_pct) AS rh
              FROM sensor_readings r JOIN sensors s ON s.id = r.sensor_id
             WHERE r.sensor_id IN (?) AND r.taken_at >= ? GROUP BY s.room_id`,
      params: [
        [2 * Math.ceil(sensorId / 2) - 1, 2 * Math.ceil(sensorId / 2)].filter((id) => id <= sensors),
        at(now.getTime() - DAY),
      ],
    },
    {
      name: "sensor chart, raw (SensorService.series): 7 days",
      sql: `SELECT * FROM sensor_readings r WHERE r.sensor_id = ? AND r.taken_at >= ? AND r.taken_at < ? ORDER BY r.taken_at ASC LIMIT 4000`,
      params: [sensorId, at(newest - 7 * DAY), at(newest)],
    },
    {
      name: "sensor chart, averaged (SensorService.series): 366 days in 2000 buckets",
      sql: `SELECT FLOOR(UNIX_TIMESTAMP(taken_at) / ?) AS b, AVG(air_temperature_c) AS air, AVG(relative_humidity_pct) AS rh,
                   AVG(surface_temperature_c) AS surface, MIN(battery_pct) AS battery
              FROM sensor_readings WHERE sensor_id = ? AND taken_at >= ? AND taken_at < ? GROUP BY b ORDER BY b`,
      params: [Math.ceil((366 * 86_400) / 2000), sensorId, at(newest - 366 * DAY), at(newest)],
    },
    {
      name: "ingest's duplicate check, as one row (LOAD DATA … IGNORE checks each row the same way, by key)",
      sql: `INSERT IGNORE INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, received_at) VALUES (?, ?, 20, 60, ?)`,
      params: [sensorId, at(newest), now],
    },
    {
      name: "case page: a case's newest 500 hand readings (ReadingService.list, newest)",
      sql: `SELECT * FROM (SELECT id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id
              FROM readings WHERE case_id = ? ORDER BY taken_at DESC, room_id DESC, id DESC LIMIT ?) latest ORDER BY taken_at, room_id, id`,
      params: [CASES / 2, 500],
    },
    {
      name: "case evaluation: a room's hand readings (ReadingService.seriesFor)",
      sql: `SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c
              FROM readings WHERE case_id = ? AND room_id = ? ORDER BY taken_at, room_id, id`,
      params: [CASES / 2, (CASES / 2) * 3],
    },
  ];

  interface Node {
    table?: { table_name: string; access_type: string; key?: string; partitions?: string[]; r_loops?: number; r_rows?: number };
    [k: string]: unknown;
  }
  /** Every table access in an ANALYZE FORMAT=JSON tree. */
  const tables = (node: unknown, out: NonNullable<Node["table"]>[] = []) => {
    if (Array.isArray(node)) node.forEach((n) => tables(n, out));
    else if (node && typeof node === "object") {
      for (const [k, v] of Object.entries(node)) {
        if (k === "table" && v && typeof v === "object") out.push(v as NonNullable<Node["table"]>);
        tables(v, out);
      }
    }
    return out;
  };

  const summary: string[] = [];
  for (const q of queries) {
    const isWrite = /^\s*INSERT/i.test(q.sql);
    const plan = (await ds.query(`EXPLAIN PARTITIONS ${q.sql}`, q.params)) as Record<string, unknown>[];
    let analysed: unknown = null;
    let best = Number.POSITIVE_INFINITY;
    for (let run = 0; run < 3; run++) {
      const runner = ds.createQueryRunner();
      try {
        if (isWrite) await runner.startTransaction();
        const t = performance.now();
        if (isWrite) {
          await runner.query(q.sql, q.params);
          best = Math.min(best, performance.now() - t);
        } else {
          const [row] = (await runner.query(`ANALYZE FORMAT=JSON ${q.sql}`, q.params)) as Record<string, string>[];
          best = Math.min(best, performance.now() - t);
          analysed = JSON.parse(Object.values(row!)[0]!);
        }
      } finally {
        if (isWrite) await runner.rollbackTransaction();
        await runner.release();
      }
    }
    const accesses = tables(analysed);
    console.log(`— ${q.name}`);
    for (const p of plan) {
      console.log(
        `    ${String(p.table)}: type ${String(p.type)}, key ${String(p.key)}, est. rows ${String(p.rows)}, ` +
          `partitions ${String(p.partitions ?? "—").split(",").length > 4 ? `${String(p.partitions).split(",").length} partitions` : String(p.partitions)}` +
          (p.Extra ? `; ${String(p.Extra)}` : ""),
      );
    }
    let examined = 0;
    for (const a of accesses) {
      const rows = Math.round((a.r_loops ?? 1) * (a.r_rows ?? 0));
      examined += rows;
      console.log(
        `    analyse ${a.table_name}: ${a.access_type} on ${a.key ?? "—"}, partitions touched ${a.partitions?.length ?? "—"}` +
          `${a.partitions && a.partitions.length <= 4 ? ` (${a.partitions.join(", ")})` : ""}, rows examined ${rows}`,
      );
    }
    console.log(`    best of 3: ${best.toFixed(1)} ms\n`);
    const touched = accesses.find(
      (a) => a.table_name === "r" || a.table_name === "sensor_readings" || a.table_name === "readings",
    );
    const planned = plan.find((p) => typeof p.partitions === "string")?.partitions as string | undefined;
    const touchedCount = touched?.partitions?.length ?? (planned ? planned.split(",").length : "—");
    summary.push(`| ${q.name} | ${touchedCount} | ${isWrite ? "—" : examined} | ${best.toFixed(1)} |`);
  }

  // The ingest itself: 96 readings for one sensor, half of them already stored (a gateway's re-send).
  const ingest = new SensorIngestService(ds, clock);
  // The last 48 stored readings again, and 48 new ones between them.
  const readings = Array.from({ length: 96 }, (_, k) => ({
    takenAt: new Date(newest - (k % 48) * INTERVAL_S * 1000 - (k < 48 ? 0 : (INTERVAL_S * 1000) / 2)).toISOString(),
    airTemperatureC: 20.1,
    relativeHumidityPct: 64.2,
  }));
  const identity = {
    id: 1,
    organisationId: 1,
    propertyId: 1,
    roomId: 1,
    serial: "EX-000001",
    mqttUsername: "ex-1",
    intervalS: 900,
    measuresSurface: false,
  };
  const t = performance.now();
  const outcome = await ingest.ingest(identity, readings, "http");
  const ingestMs = performance.now() - t;
  console.log(
    `— ingest (SensorIngestService.ingest, LOAD DATA … IGNORE): 96 readings, ${outcome.stored} stored, ${outcome.duplicates} duplicates, ` +
      `${outcome.refused.length} refused, ${ingestMs.toFixed(1)} ms\n`,
  );
  summary.push(`| ingest of 96 readings, 48 of them duplicates (LOAD DATA … IGNORE) | 1–2 | — | ${ingestMs.toFixed(1)} |`);

  console.log(`| query | partitions touched | rows examined | ms (best of 3) |\n|---|---|---|---|\n${summary.join("\n")}`);
} finally {
  await bench.stop();
}
