// Dashboard benchmark (`npm run bench:insight`), on a throwaway MariaDB:
//  1. seeds the queue benchmark's landlord (scripts/bench-queue.ts `seed`: 20 000 homes, 100 000 cases
//     over three years, 5 000 000 readings, inspections and written summaries, by LOAD DATA);
//  2. writes the dashboard's clock projection (case_milestones) for every case with the app's own code
//     (computeDeadlines and milestoneFigures, as TriageService.refresh does), by LOAD DATA;
//  3. runs the real app in this process and asks GET /api/insight/dashboard one request at a time
//     (the default period, the last 12 months, and one estate, taking turns), and the same aggregates
//     (the statements InsightService issues, captured, not retyped) through a mysql2 pool, the same way;
//  4. prints median and p95 of both and the target: API ≤ 1.5 × raw + 5 ms (median and p95).
//  5. the case evidence pack of a case with 20 photos and 10 000 readings, made in a child process: each
//     pack's time, pages and size, and the child's RSS (scripts/lib/evidence-pack-bench.ts).
// Options: --requests <n> (default 40) per side; --cases <n> scales the data down (readings 50 a case,
// homes one per 5 cases), as bench:queue.
import type { AddressInfo } from "node:net";
import { cpus, loadavg } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { closeSync, openSync, rmSync, writeSync } from "node:fs";
import mysql from "mysql2/promise";
import type { DataSource } from "typeorm";
import { computeDeadlines, ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type HazardClass } from "../src/lib/domain/deadlines.js";
import { createApp } from "../server/app.js";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import type { Actor } from "../server/modules/auth/actor.js";
import { InsightService } from "../server/modules/insight/insight.service.js";
import { milestoneFigures } from "../server/modules/triage/triage.service.js";
import { startBenchDatabase } from "./lib/bench-database.js";
import { benchEvidencePack } from "./lib/evidence-pack-bench.js";
import { loadDataConnection } from "./lib/mariadb.js";
import { seed } from "./bench-queue.js";

const argv = process.argv.slice(2);
const option = (name: string, fallback: number) => {
  const i = argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(argv[i + 1]) : fallback;
  return Number.isFinite(v) && v > 0 ? v : fallback;
};
const REQUESTS = option("requests", 40);
const PASSWORD = "bench-only-password"; // bench-queue's officer password
const fmt = (n: number) => Math.round(n).toLocaleString("en-GB");
const ms1 = (n: number) => n.toFixed(1);
const sqlTime = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");

function quantile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))]!;
}

/** Writes case_milestones for every seeded case from its facts, with the app's code. */
async function project(db: Parameters<typeof loadDataConnection>[0], dir: string, now: Date) {
  const started = performance.now();
  // One pass over each table (grouped), through its own connection: no per-case subqueries, no query watch.
  const reader = await loadDataConnection(db);
  let rows: {
    id: number;
    org: number;
    aware_at: Date;
    hazard_class: HazardClass | null;
    works_done_at: Date | null;
    inspected: Date | null;
    summary: Date | null;
    work: Date | null;
  }[];
  try {
    [rows] = (await reader.query(
      `SELECT c.id, c.organisation_id AS org, c.aware_at, c.hazard_class, c.works_done_at,
              i.at AS inspected, w.at AS summary, o.at AS work
         FROM cases c
         LEFT JOIN (SELECT case_id, MIN(inspected_at) AS at FROM inspections GROUP BY case_id) i ON i.case_id = c.id
         LEFT JOIN (SELECT case_id, MIN(sent_at) AS at FROM written_summaries GROUP BY case_id) w ON w.case_id = c.id
         LEFT JOIN (SELECT case_id, MIN(completed_at) AS at FROM work_orders WHERE status = 'done' GROUP BY case_id) o ON o.case_id = c.id`,
    )) as unknown as [typeof rows];
  } finally {
    await reader.end();
  }
  const file = path.join(dir, "case_milestones.tsv");
  const fd = openSync(file, "w");
  let count = 0;
  let buffer: string[] = [];
  const n = (d: Date | null) => (d === null ? "\\N" : sqlTime(new Date(d)));
  for (const r of rows) {
    const deadlines = computeDeadlines({
      hazardClass: r.hazard_class,
      awareAt: new Date(r.aware_at),
      investigationEndedAt: r.inspected,
      summarySentAt: r.summary,
      safetyWorkStartedAt: r.work,
      supplementaryWorkStartedAt: r.work,
      now,
      policy: ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY,
    });
    for (const m of milestoneFigures({ awareAt: new Date(r.aware_at), worksDoneAt: r.works_done_at }, deadlines)) {
      buffer.push([r.id, m.milestone, r.org, n(m.dueAt), n(m.doneAt), m.workingDays ?? "\\N"].join("\t") + "\n");
      count++;
    }
    if (buffer.length >= 20_000) {
      writeSync(fd, buffer.join(""));
      buffer = [];
    }
  }
  writeSync(fd, buffer.join(""));
  closeSync(fd);
  const loader = await loadDataConnection(db);
  try {
    await loader.query({
      sql: "LOAD DATA LOCAL INFILE ? INTO TABLE case_milestones FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' (case_id, milestone, organisation_id, due_at, done_at, working_days)",
      values: [file],
    });
    await loader.query("ANALYZE TABLE case_milestones");
  } finally {
    await loader.end();
  }
  rmSync(file, { force: true });
  return { rows: count, ms: performance.now() - started };
}

async function signIn(url: string, email: string): Promise<string> {
  const first = await fetch(`${url}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const cookieOf = (res: Response) =>
    res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .find((c) => c.startsWith("dewline.sid="));
  const res = await fetch(`${url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: cookieOf(first) ?? "" },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  const cookie = cookieOf(res);
  if (res.status !== 200 || !cookie) throw new Error(`Sign-in failed: ${res.status} ${await res.text()}`);
  return cookie;
}

/** The case evidence pack of a case with 20 photos and 10 000 readings: time and memory (scripts/lib/evidence-pack-bench.ts). */
async function evidencePackTiming(context: { dir: string; ds: DataSource }): Promise<void> {
  const r = await benchEvidencePack(context.ds, { uploadsDir: path.join(context.dir, "uploads") });
  console.log(
    `Evidence pack — a case with ${r.photos} photos and ${fmt(r.readings)} readings: ${r.pages} pages, ${(r.bytes / 1024 / 1024).toFixed(1)} MB; ` +
      `${r.ms.map((ms) => `${(ms / 1000).toFixed(2)} s`).join(", ")} (first pack first); RSS ${r.rssBeforeMb.toFixed(0)} MB before, ` +
      `at most ${r.rssPeakDuringMb.toFixed(0)} MB while making them (process peak ${r.maxRssMb.toFixed(0)} MB, start-up included)`,
  );
}

async function main() {
  const bench = await startBenchDatabase("insight");
  let server: ReturnType<ReturnType<typeof createApp>["listen"]> | undefined;
  let ctx: Awaited<ReturnType<typeof createAppContext>> | undefined;
  let pool: mysql.Pool | undefined;
  try {
    const now = new Date();
    console.log(
      `Dashboard benchmark — ${cpus().length} CPUs, load average ${loadavg()
        .map((l) => l.toFixed(2))
        .join(" ")}`,
    );
    const seedStart = performance.now();
    const seeded = await seed(bench.ds, bench.db, bench.dir, now);
    const c = seeded.counts;
    console.log(
      `  seeded in ${((performance.now() - seedStart) / 1000).toFixed(1)} s (LOAD DATA ${seeded.loadTimes.join(", ")}): ` +
        `${fmt(c.homes)} homes, ${fmt(c.cases)} cases (${fmt(c.open)} open), ${fmt(c.readings)} readings, ${fmt(c.inspections)} inspections, ${fmt(c.summaries)} written summaries`,
    );
    const projection = await project(bench.db, bench.dir, now);
    console.log(
      `  case_milestones: ${fmt(projection.rows)} rows in ${(projection.ms / 1000).toFixed(1)} s (the app's deadline code)`,
    );

    const officer: Actor = seeded.officer;
    const [estateRow] = (await bench.ds.query(
      "SELECT estate FROM properties WHERE organisation_id = ? GROUP BY estate ORDER BY COUNT(*) DESC LIMIT 1",
      [officer.organisationId],
    )) as { estate: string }[];
    const filters = [{}, { estate: estateRow!.estate }];

    // The statements the service issues, captured from a service whose data source records them.
    const captured: { sql: string; params: unknown[] }[][] = [];
    for (const f of filters) {
      const list: { sql: string; params: unknown[] }[] = [];
      const recording = {
        query: (sql: string, params: unknown[] = []) => {
          list.push({ sql, params });
          return bench.ds.query(sql, params);
        },
      } as unknown as DataSource;
      // Complaints are read by their own service (a find over the period); the raw side runs that SELECT.
      const complaints = {
        figures: async (org: number, from: Date, to: Date) => {
          await recording.query("SELECT * FROM complaints WHERE organisation_id = ? AND raised_at BETWEEN ? AND ?", [
            org,
            from,
            to,
          ]);
          const stage = {
            reached: 0,
            acknowledgedOnTime: 0,
            acknowledgedLate: 0,
            acknowledgeOverdue: 0,
            respondedOnTime: 0,
            respondedLate: 0,
            respondOverdue: 0,
            extensions: 0,
          };
          return {
            from,
            to,
            raised: 0,
            open: 0,
            closed: 0,
            closedAtStage1: 0,
            escalated: 0,
            stage1: stage,
            stage2: stage,
            apologies: 0,
            compensation: { offeredCount: 0, offeredPence: 0, acceptedCount: 0, paidCount: 0, paidPence: 0 },
          };
        },
      };
      await new InsightService(recording, { refreshStale: async () => 0 }, { now: () => new Date() }, complaints).dashboard(
        officer,
        f,
      );
      captured.push(list);
    }
    console.log(`  the dashboard issues ${captured[0]!.length} statements per request (run side by side, as the service does)`);

    const config = loadConfig({
      ...process.env,
      NODE_ENV: "production",
      LOG_LEVEL: "error",
      APP_URL: "http://127.0.0.1",
      SESSION_SECRET: "bench-insight-session-secret-only-for-this-run",
      DB_HOST: "127.0.0.1",
      DB_PORT: String(bench.db.port),
      DB_NAME: bench.db.name,
      DB_USER: bench.db.user,
      DB_PASSWORD: bench.db.password,
    });
    ctx = await createAppContext(config);
    server = createApp(ctx).listen(0, "127.0.0.1");
    await new Promise((r) => server!.once("listening", r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const cookie = await signIn(url, officer.email);
    // The stale figures the seed left are worked out first, as the sweep would, so the run measures the dashboard.
    while ((await ctx.services.triage.refreshStale(officer.organisationId, 500)) > 0);

    pool = mysql.createPool({
      host: "127.0.0.1",
      port: bench.db.port,
      user: bench.db.user,
      password: bench.db.password,
      database: bench.db.name,
      timezone: "Z",
      connectionLimit: 10,
    });
    const api: number[] = [];
    const raw: number[] = [];
    const apiOnce = async (i: number) => {
      const q = new URLSearchParams(filters[i % filters.length] as Record<string, string>).toString();
      const start = performance.now();
      const res = await fetch(`${url}/api/insight/dashboard${q ? `?${q}` : ""}`, { headers: { cookie } });
      await res.arrayBuffer();
      if (res.status !== 200) throw new Error(`dashboard answered ${res.status}`);
      return performance.now() - start;
    };
    const rawOnce = async (i: number) => {
      const start = performance.now();
      await Promise.all(captured[i % captured.length]!.map((s) => pool!.query(s.sql, s.params)));
      return performance.now() - start;
    };
    for (let i = 0; i < 4; i++) {
      await apiOnce(i);
      await rawOnce(i);
    } // warm-up
    for (let i = 0; i < REQUESTS; i++) {
      api.push(await apiOnce(i));
      raw.push(await rawOnce(i));
    }
    const [am, ap, rm, rp] = [quantile(api, 0.5), quantile(api, 0.95), quantile(raw, 0.5), quantile(raw, 0.95)];
    const pass = (a: number, r: number) => a <= 1.5 * r + 5;
    console.log(`GET /api/insight/dashboard, one request at a time, ${REQUESTS} each (default period and one estate, in turn):`);
    console.log(`  API  median ${ms1(am)} ms, p95 ${ms1(ap)} ms`);
    console.log(`  raw  median ${ms1(rm)} ms, p95 ${ms1(rp)} ms (the same statements through mysql2)`);
    console.log(
      `  ratio median ${(am / rm).toFixed(2)}×, p95 ${(ap / rp).toFixed(2)}×; target API ≤ 1.5 × raw + 5 ms: median ${pass(am, rm) ? "PASS" : "FAIL"} (limit ${ms1(1.5 * rm + 5)} ms), p95 ${pass(ap, rp) ? "PASS" : "FAIL"} (limit ${ms1(1.5 * rp + 5)} ms)`,
    );
    if (!pass(am, rm) || !pass(ap, rp)) process.exitCode = 1;
    // Which statement the time goes to: each alone, median of 5 (default period).
    console.log("  each statement alone (default period), median of 5:");
    for (const s of captured[0]!) {
      const times: number[] = [];
      for (let i = 0; i < 5; i++) {
        const start = performance.now();
        await pool.query(s.sql, s.params);
        times.push(performance.now() - start);
      }
      console.log(`    ${ms1(quantile(times, 0.5)).padStart(8)} ms  ${s.sql.replace(/\s+/g, " ").slice(0, 110)}`);
    }

    await evidencePackTiming({ dir: bench.dir, ds: bench.ds });
  } finally {
    await pool?.end().catch(() => undefined);
    server?.closeAllConnections();
    await new Promise((r) => (server ? server.close(r) : r(undefined)));
    await ctx?.close().catch(() => undefined);
    await bench.stop();
  }
}

await main();
