// Readings-import benchmark (`npm run bench:import`), on a throwaway MariaDB:
//  1. a logger CSV of 1 000 000 rows (one a minute, Europe/London wall-clock times, temperature
//     and humidity) through ReadingImportService.import — the whole call: detection, streaming,
//     parsing, time-zone conversion, validation, INSERT IGNORE batches, commit;
//  2. the same rows, pre-converted to the table's column order and UTC, with MariaDB's own
//     LOAD DATA LOCAL INFILE into a scratch table shaped like `readings` — only the LOAD DATA
//     statement is timed; it runs before and after ours and the faster run is kept;
//  3. one 12-megapixel JPEG through the photo pipeline's processPhoto.
// Targets: ours ≥ 60 % of LOAD DATA's rows/s; our peak RSS < 300 MB; the photo < 400 ms.
import { closeSync, openSync, writeSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import type mysql from "mysql2/promise";
import type { DataSource } from "typeorm";
import { startBenchDatabase } from "./lib/bench-database.js";
import { Case } from "../server/modules/cases/case.entity.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { Property } from "../server/modules/properties/property.entity.js";
import { Room } from "../server/modules/properties/room.entity.js";
import { createServices } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { createLogger } from "../server/lib/logger.js";
import { createMailer } from "../server/lib/mailer.js";
import { User } from "../server/modules/users/user.entity.js";
import { ZoneConverter } from "../src/lib/domain/time-zone.js";
import { loadDataConnection } from "./lib/mariadb.js";
import { mulberry32 } from "../server/lib/random.js";

const ROWS = 1_000_000;
const START_UTC_MS = Date.UTC(2024, 10, 1); // 1 November 2024; a million minutes later is September 2026
const MB = 1024 * 1024;

const pad = (n: number) => (n < 10 ? `0${n}` : String(n));
const wallText = (ms: number) => {
  const d = new Date(ms);
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:00`;
};

/**
 * The logger file (local London times, as a logger set to UK time writes them; the autumn hour
 * repeats, so ours counts those 60 rows as duplicates) and the LOAD DATA file (the same readings
 * in UTC, in the scratch table's column order). Written in chunks: neither is held in memory.
 */
function writeFiles(dir: string, caseId: number, roomId: number): { csv: string; load: string; bytes: number } {
  const csv = path.join(dir, "logger.csv");
  const load = path.join(dir, "load-data.csv");
  const a = openSync(csv, "w");
  const b = openSync(load, "w");
  const london = new ZoneConverter("Europe/London");
  const random = mulberry32(20241101);
  let bytes = 0;
  let ours: string[] = ["Timestamp,Temperature (°C),Humidity (%rh)"];
  let theirs: string[] = [];
  for (let i = 0; i < ROWS; i++) {
    const utc = START_UTC_MS + i * 60_000;
    const day = (i % 1440) / 1440;
    const t = (17 + 3 * Math.sin(2 * Math.PI * day) + random()).toFixed(1);
    const rh = (60 + 15 * Math.sin(2 * Math.PI * (day + 0.3)) + 5 * random()).toFixed(1);
    ours.push(`${wallText(utc + london.offsetAt(utc))},${t},${rh}`);
    theirs.push(`${caseId},${roomId},${wallText(utc)},${t},${rh},import`);
    if (ours.length >= 10_000 || i === ROWS - 1) {
      const chunk = ours.join("\n") + "\n";
      bytes += Buffer.byteLength(chunk);
      writeSync(a, chunk);
      writeSync(b, theirs.join("\n") + "\n");
      ours = [];
      theirs = [];
    }
  }
  closeSync(a);
  closeSync(b);
  return { csv, load, bytes };
}

async function makeCase(ds: DataSource): Promise<{ caseId: number; roomId: number; actorId: number }> {
  const org = await ds.getRepository(Organisation).save({ name: "Bench Homes" });
  const user = await ds.getRepository(User).save(
    ds.getRepository(User).create({
      organisationId: org.id,
      email: "officer@bench.example",
      name: "Bench officer",
      role: "officer",
      status: "active",
      passwordHash: null,
    }),
  );
  const home = await ds.getRepository(Property).save({
    organisationId: org.id,
    addressLine1: "1 Bench Street",
    addressLine2: null,
    town: "Benchford",
    postcode: "ZX1 1AA",
    uprn: null,
    estate: "Bench Estate",
    block: null,
    builtForm: "mid-terrace",
    wallType: "solid-brick",
    glazingType: "single",
    heatingType: "gas-boiler",
  });
  const room = await ds.getRepository(Room).save({ propertyId: home.id, name: "Bedroom", kind: "bedroom" });
  const c = await ds.getRepository(Case).save(
    ds.getRepository(Case).create({
      organisationId: org.id,
      propertyId: home.id,
      reporterUserId: user.id,
      channel: "tenant-online",
      awareAt: new Date(),
      description: "Benchmark case.",
      locations: ["window"],
      observations: ["condensation"],
    }),
  );
  return { caseId: c.id, roomId: room.id, actorId: user.id };
}

/** Peak RSS while `run` runs, sampled every 20 ms, and the process's lifetime maximum after it. */
async function withRss<T>(run: () => Promise<T>): Promise<{ result: T; sampledPeakMb: number; maxRssMb: number }> {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss);
  }, 20);
  try {
    const result = await run();
    peak = Math.max(peak, process.memoryUsage().rss);
    return { result, sampledPeakMb: peak / MB, maxRssMb: process.resourceUsage().maxRSS / 1024 };
  } finally {
    clearInterval(timer);
  }
}

async function benchPhoto(dir: string): Promise<{ ms: number[]; width: number; height: number }> {
  const width = 4000;
  const height = 3000;
  // A gradient with noise on top: a photo-like amount of detail for the encoder.
  const raw = Buffer.alloc(width * height * 3);
  const random = mulberry32(12);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      const n = random() * 40;
      raw[i] = ((x / width) * 200 + n) | 0;
      raw[i + 1] = ((y / height) * 200 + n) | 0;
      raw[i + 2] = (((x + y) / (width + height)) * 200 + n) | 0;
    }
  }
  const source = path.join(dir, "photo-12mp.jpg");
  // Loaded only now, so the import's memory figure is not inflated by libvips.
  const { default: sharp } = await import("sharp");
  const { processPhoto } = await import("../server/modules/photos/photo-processing.js");
  await sharp(raw, { raw: { width, height, channels: 3 } })
    .jpeg({ quality: 90 })
    .toFile(source);
  const out = path.join(dir, "photos");
  await processPhoto(source, out); // warm-up: loads libvips' codecs
  const ms: number[] = [];
  for (let i = 0; i < 5; i++) {
    const start = performance.now();
    await processPhoto(source, out);
    ms.push(performance.now() - start);
  }
  return { ms, width, height };
}

async function main(): Promise<void> {
  const bench = await startBenchDatabase("import");
  const { dir, db, ds } = bench;
  let loader: mysql.Connection | undefined;
  try {
    const ids = await makeCase(ds);

    const t0 = performance.now();
    const files = writeFiles(dir, ids.caseId, ids.roomId);
    console.log(
      `Readings import benchmark — ${ROWS.toLocaleString("en-GB")} rows, ${(files.bytes / MB).toFixed(1)} MB of CSV (written in ${((performance.now() - t0) / 1000).toFixed(1)} s)`,
    );

    loader = await loadDataConnection(db);
    await loader.query("CREATE TABLE readings_load_data LIKE readings");
    const loadData = async () => {
      await loader!.query("TRUNCATE TABLE readings_load_data");
      const start = performance.now();
      const [result] = await loader!.query({
        sql:
          "LOAD DATA LOCAL INFILE ? IGNORE INTO TABLE readings_load_data FIELDS TERMINATED BY ',' LINES TERMINATED BY '\\n' " +
          "(case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, source)",
        values: [files.load],
      });
      return { ms: performance.now() - start, rows: (result as { affectedRows: number }).affectedRows };
    };

    const loadBefore = await loadData();
    const rssBefore = process.memoryUsage().rss / MB;
    // The real service wiring, as the app builds it (the mailer is never used here).
    const config = loadConfig({ ...process.env, NODE_ENV: "test" });
    const service = createServices(config, ds, createMailer(config), createLogger("silent")).imports;
    const ours = await withRss(async () => {
      const start = performance.now();
      const r = await service.import({ ...ids, filePath: files.csv, fileName: "logger.csv" });
      return { ...r, ms: performance.now() - start };
    });
    const loadAfter = await loadData();
    const load = loadBefore.ms <= loadAfter.ms ? loadBefore : loadAfter;

    const [{ n }] = await ds.query("SELECT COUNT(*) AS n FROM readings WHERE case_id = ?", [ids.caseId]);
    const oursRate = (ROWS / ours.result.ms) * 1000;
    const loadRate = (ROWS / load.ms) * 1000;
    const ratio = oursRate / loadRate;
    const fmt = (x: number) => Math.round(x).toLocaleString("en-GB");
    console.log(
      `  ReadingImportService.import   ${(ours.result.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(oursRate).padStart(9)} rows/s   ` +
        `(imported ${fmt(ours.result.imported)}, duplicates ${ours.result.duplicates} from the repeated autumn hour, rejected ${ours.result.rejected}; ${fmt(Number(n))} rows in the table)`,
    );
    console.log(
      `  LOAD DATA LOCAL INFILE        ${(load.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(loadRate).padStart(9)} rows/s   ` +
        `(the statement alone, pre-converted UTC file; faster of ${(loadBefore.ms / 1000).toFixed(2)} s before and ${(loadAfter.ms / 1000).toFixed(2)} s after ours; ${fmt(load.rows)} rows)`,
    );
    console.log(
      `  ratio ours / LOAD DATA        ${(ratio * 100).toFixed(0)} %   (target ≥ 60 %) ${ratio >= 0.6 ? "PASS" : "FAIL"}`,
    );
    const rssOk = ours.maxRssMb < 300;
    console.log(
      `  peak RSS of this process      ${ours.maxRssMb.toFixed(0)} MB (process maximum up to the end of the import; sampled during it ${ours.sampledPeakMb.toFixed(0)} MB, ${rssBefore.toFixed(0)} MB just before it)   (target < 300 MB) ${rssOk ? "PASS" : "FAIL"}`,
    );

    const photo = await benchPhoto(dir);
    const sorted = [...photo.ms].sort((a, b) => a - b);
    const median = sorted[sorted.length >> 1];
    console.log(
      `Photo: processPhoto (server/modules/photos/photo-processing.ts) on a ${photo.width}×${photo.height} JPEG — decode, rotate, 2048 px display JPEG, 320 px thumbnail, sha256, write both`,
    );
    console.log(
      `  median ${median.toFixed(0)} ms of 5 (after a warm-up; min ${sorted[0].toFixed(0)}, max ${sorted.at(-1)!.toFixed(0)})   (target < 400 ms) ${median < 400 ? "PASS" : "FAIL"}`,
    );
    if (ratio < 0.6 || !rssOk || median >= 400) process.exitCode = 1;
  } finally {
    await loader?.end().catch(() => undefined);
    await bench.stop();
  }
}

await main();
