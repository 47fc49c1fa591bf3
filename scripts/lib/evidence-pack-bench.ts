// The evidence pack of a big case, timed: `benchEvidencePack(ds, { uploadsDir })` seeds a case with 20
// photos (12-megapixel JPEGs through the real photo pipeline, stored as 2048 px display copies) and
// 10 000 readings in the given (migrated) database, then makes its pack in a child process of its own
// and reports the time, the PDF's size and pages, and that process's peak RSS (before the packs and
// after), so the figure is the pack's and not the seeding's or the caller's. Called by bench:insight.
import { spawn } from "node:child_process";
import { writeFile, mkdir } from "node:fs/promises";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { Writable } from "node:stream";
import { fileURLToPath } from "node:url";
import sharp from "sharp";
import type { DataSource } from "typeorm";
import { caseReportSchema } from "../../src/lib/schemas/case-report.js";
import { createServices } from "../../server/app-context.js";
import { loadConfig } from "../../server/config/env.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import type { Actor } from "../../server/lib/actor.js";
import { systemClock } from "../../server/lib/clock.js";
import { createLogger } from "../../server/lib/logger.js";
import { createMailer } from "../../server/lib/mailer.js";
import { WorkerPool } from "../../server/workers/pool.js";
import { makeLandlord } from "../../tests/support/factories.js";

export interface EvidencePackBenchOptions {
  /** The photo store for this run (a folder of the caller's temporary directory). */
  uploadsDir: string;
  photos?: number;
  readings?: number;
  /** Packs made one after the other in the child (the first is also reported on its own). */
  runs?: number;
}

export interface EvidencePackBenchResult {
  caseId: number;
  photos: number;
  readings: number;
  pages: number;
  bytes: number;
  /** Each pack's time, ms, first (cold: modules, fonts, first queries) first. */
  ms: number[];
  /** The child's RSS just before the first pack (Node, tsx, the app's modules, the worker pool), MB. */
  rssBeforeMb: number;
  /** The highest RSS sampled every 5 ms while the packs were made, MB. */
  rssPeakDuringMb: number;
  /** The kernel's peak RSS of the child over its whole life (start-up included), MB. */
  maxRssMb: number;
}

interface ChildJob {
  db: { host: string; port: number; name: string; user: string; password: string };
  uploadsDir: string;
  caseId: number;
  actor: Actor;
  runs: number;
}

const benchConfig = (uploadsDir: string) =>
  loadConfig({ ...process.env, NODE_ENV: "test", LOG_LEVEL: "silent", UPLOADS_DIR: uploadsDir });

/** Seeds the case, then times its pack in a child process. */
export async function benchEvidencePack(ds: DataSource, opts: EvidencePackBenchOptions): Promise<EvidencePackBenchResult> {
  const photoCount = opts.photos ?? 20;
  const readingCount = opts.readings ?? 10_000;
  const config = benchConfig(opts.uploadsDir);
  const workers = new WorkerPool(config.workers);
  const services = createServices(config, ds, createMailer(config), createLogger("silent"), systemClock, workers);
  try {
    const landlord = await makeLandlord(ds);
    const asActor = (u: { id: number; email: string; name: string; role: Actor["role"] }): Actor => ({
      id: u.id,
      email: u.email,
      name: u.name,
      role: u.role,
      organisationId: landlord.org.id,
    });
    const tenant = asActor(landlord.tenant);
    const officer = asActor(landlord.officer);
    const roomId = await firstRoom(ds, landlord.home.id);
    const created = await services.cases.create(
      tenant,
      caseReportSchema.parse({
        description: "Black mould on the bedroom wall behind the wardrobe, and the window runs with water every morning.",
        locations: ["external-wall"],
        observations: ["mould-spots"],
        roomIds: [roomId],
      }),
    );

    // Photos: 12-megapixel JPEGs of noise (they compress like photos do, unlike flat colour), five an upload.
    const incoming = services.photos.incomingDir;
    await mkdir(incoming, { recursive: true });
    for (let start = 0; start < photoCount; start += 5) {
      const files = [];
      for (let i = start; i < Math.min(photoCount, start + 5); i++) {
        const file = path.join(incoming, `bench-${created.id}-${i}.jpg`);
        await writeFile(file, await noisyJpeg(4000, 3000, i));
        files.push({ path: file, originalname: `photo-${i}.jpg` });
      }
      await services.photos.addToCase(tenant, created.id, files);
    }

    // Readings: one every 5 minutes, a daily swing that reaches condensation some mornings.
    const startAt = Date.UTC(2026, 0, 1);
    for (let s = 0; s < readingCount; s += 5_000) {
      const values: string[] = [];
      for (let k = s; k < Math.min(readingCount, s + 5_000); k++) {
        const at = new Date(startAt + k * 300_000).toISOString().slice(0, 19).replace("T", " ");
        const hour = (k / 12) % 24;
        const rh = 62 + 18 * Math.max(0, Math.cos(((hour - 7) / 24) * 2 * Math.PI));
        values.push(
          `(${created.id},${roomId},'${at}',${(18 + (k % 7) / 10).toFixed(1)},${rh.toFixed(1)},${(11 + (k % 5) / 10).toFixed(1)},NULL,'import',NULL)`,
        );
      }
      await ds.query(
        "INSERT INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id) VALUES " +
          values.join(","),
      );
    }
    await ds.transaction((m) => services.readings.markChanged(m, created.id, [roomId]));
    // The room's evaluation is stored as the app would have it after an import (not part of the pack's time).
    await services.evaluation.forCase(officer, created.id);
    await services.readings.whenIdle();

    // The child connects to the same database (a MariaDB DataSource's options carry where it is).
    const o = ds.options as { host?: string; port?: number; database?: unknown; username?: string; password?: unknown };
    const job: ChildJob = {
      db: { host: o.host!, port: o.port!, name: String(o.database), user: o.username!, password: String(o.password) },
      uploadsDir: opts.uploadsDir,
      caseId: created.id,
      actor: officer,
      runs: opts.runs ?? 3,
    };
    const r = await runChild(job);
    return { caseId: created.id, photos: photoCount, readings: readingCount, ...r };
  } finally {
    await services.readings.whenIdle().catch(() => undefined);
    await workers.close();
  }
}

async function firstRoom(ds: DataSource, propertyId: number): Promise<number> {
  const [row] = (await ds.query("SELECT id FROM rooms WHERE property_id = ? ORDER BY id LIMIT 1", [propertyId])) as {
    id: number;
  }[];
  if (!row) throw new Error("the bench home has no room");
  return row.id;
}

function noisyJpeg(width: number, height: number, seed: number): Promise<Buffer> {
  const raw = Buffer.alloc(width * height * 3);
  let x = 2463534242 + seed;
  for (let i = 0; i < raw.length; i += 3) {
    // xorshift: cheap, repeatable texture around a muted base colour.
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    const n = x & 63;
    raw[i] = 90 + n;
    raw[i + 1] = 100 + (n >> 1);
    raw[i + 2] = 80 + (n >> 2);
  }
  return sharp(raw, { raw: { width, height, channels: 3 } })
    .jpeg({ quality: 85 })
    .toBuffer();
}

function runChild(job: ChildJob): Promise<Omit<EvidencePackBenchResult, "caseId" | "photos" | "readings">> {
  return new Promise((resolve, reject) => {
    const proc = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), CHILD_MODE, JSON.stringify(job)], {
      stdio: ["ignore", "pipe", "inherit"],
    });
    let out = "";
    proc.stdout.setEncoding("utf8").on("data", (d: string) => (out += d));
    proc.on("error", reject);
    proc.on("exit", (code) => {
      const last = out.trim().split("\n").pop() ?? "";
      if (code === 0) resolve(JSON.parse(last));
      else reject(new Error(`the evidence-pack bench child exited with ${code}: ${out}`));
    });
  });
}

const CHILD_MODE = "evidence-pack-child";

/** Child: the pack made `runs` times into a byte counter (as to a socket that keeps up), timed. */
async function child(job: ChildJob) {
  const ds = createDataSource({
    ...job.db,
    timeouts: { connectMs: 10_000, stallCheckMs: 5_000, queryMs: 300_000, acquireMs: 60_000 },
  });
  await ds.initialize();
  const config = benchConfig(job.uploadsDir);
  const workers = new WorkerPool(config.workers);
  const services = createServices(config, ds, createMailer(config), createLogger("silent"), systemClock, workers);
  try {
    const rssBeforeMb = process.memoryUsage().rss / 1024 / 1024;
    let rssPeakDuringMb = rssBeforeMb;
    const sampler = setInterval(() => {
      rssPeakDuringMb = Math.max(rssPeakDuringMb, process.memoryUsage().rss / 1024 / 1024);
    }, 5);
    const ms: number[] = [];
    let bytes = 0;
    let pages = 0;
    for (let i = 0; i < job.runs; i++) {
      bytes = 0;
      const sink = new Writable({
        write(chunk: Buffer, _enc, done) {
          bytes += chunk.length;
          done();
        },
      });
      const finished = new Promise<void>((resolve, reject) => sink.on("finish", resolve).on("error", reject));
      const start = performance.now();
      const pack = await services.evidencePacks.prepare(job.actor, job.caseId);
      pages = (await pack.write(sink)).pages;
      await finished;
      ms.push(performance.now() - start);
    }
    clearInterval(sampler);
    return { ms, bytes, pages, rssBeforeMb, rssPeakDuringMb, maxRssMb: process.resourceUsage().maxRSS / 1024 };
  } finally {
    await services.readings.whenIdle().catch(() => undefined);
    await workers.close();
    await ds.destroy();
  }
}

if (process.argv[2] === CHILD_MODE && process.argv[1] === fileURLToPath(import.meta.url)) {
  const result = await child(JSON.parse(process.argv[3]!) as ChildJob);
  console.log(JSON.stringify(result));
  process.exit(0);
}
