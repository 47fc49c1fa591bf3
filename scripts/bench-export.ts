// Export benchmark (`npm run bench:export`), on a throwaway MariaDB: 100 000 rows in each table view
// (the officers' queue, homes, work orders, accounts, and one case's readings), each inserted with one
// INSERT … SELECT from MariaDB's sequence engine, with many rows sharing their sort values (a priority
// is shared by ~1 000 cases, a target date by ~2 700 orders) as keyset pages must cope with. Then every
// export as CSV and as .xlsx through the real app, run in a child process (this script is the client:
// it downloads each file and throws it away as it arrives). Prints, per export: the time, the size, the
// peak RSS of the child during that download (VmRSS from /proc sampled every 20 ms; a fresh child per export) and the time of the
// first and the last page query (from the app's own "export sent" log line: keyset pages must not slow
// down deep in the table, as OFFSET pages did). Target: peak RSS < 300 MB.
//
// The queue's stored triage figures are written here directly and left fresh (triage_due_at NULL):
// they are plausible values for sorting, not worked out from facts (bench:queue checks those).
import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import type { DataSource } from "typeorm";
import { createApp } from "../server/app.js";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { startBenchDatabase } from "./lib/bench-database.js";
import { hashPassword } from "../server/modules/auth/passwords.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { User } from "../server/modules/users/user.entity.js";

const ROWS = 100_000;
const MB = 1024 * 1024;
const PASSWORD = "bench-export-password";
const SERVE_FLAG = "--serve-app";

interface Seeded {
  email: string;
  caseId: number;
  roomId: number;
}

async function seed(ds: DataSource): Promise<Seeded> {
  const org = await ds.getRepository(Organisation).save({ name: "Bench Homes" });
  const admin = await ds.getRepository(User).save(
    ds.getRepository(User).create({
      organisationId: org.id,
      email: "admin@bench.example",
      name: "Bench Admin",
      role: "admin",
      status: "active",
      passwordHash: await hashPassword(PASSWORD),
    }),
  );
  const roles = "'officer', 'maintenance', 'tenant'";
  // Accounts: three roles, 500 names between them.
  await ds.query(
    `INSERT INTO users (organisation_id, email, name, role, status, password_hash)
     SELECT ?, CONCAT('person', seq, '@bench.example'), CONCAT('Person ', seq MOD 500), ELT(seq MOD 3 + 1, ${roles}),
            ELT(seq MOD 4 + 1, 'active', 'active', 'invited', 'disabled'), NULL
     FROM seq_1_to_${ROWS - 1}`,
    [org.id],
  );
  await ds.query(
    `INSERT INTO properties (organisation_id, address_line1, address_line2, town, postcode, uprn, estate, block,
                             built_form, wall_type, glazing_type, heating_type, ventilation)
     SELECT ?, CONCAT('Flat ', seq MOD 40 + 1, ', ', seq DIV 40 + 1, ' Heron Walk'), NULL, 'Testford',
            CONCAT('ZX', seq MOD 9 + 1, ' ', seq MOD 10, 'AB'), LPAD(seq, 12, '0'), CONCAT('Estate ', seq MOD 50),
            CONCAT('Block ', seq DIV 40 + 1), 'flat', 'filled-cavity', 'modern-double', 'gas-boiler', 'extract-fans'
     FROM seq_1_to_${ROWS}`,
    [org.id],
  );
  const [{ first }] = (await ds.query("SELECT MIN(id) AS first FROM properties WHERE organisation_id = ?", [org.id])) as {
    first: number;
  }[];
  await ds.query("INSERT INTO rooms (property_id, name, kind) VALUES (?, 'Bedroom', 'bedroom'), (?, 'Kitchen', 'kitchen')", [
    first,
    first,
  ]);
  const statuses = "'new', 'triaged', 'inspection-booked', 'investigated', 'works-planned', 'works-done', 'monitoring', 'closed'";
  await ds.query(
    `INSERT INTO cases (reference, organisation_id, property_id, reporter_user_id, channel, aware_at, description, locations,
                        observations, area, vulnerable_household, status, risk_state, mould_index, hhsrs_band, hhsrs_category,
                        priority, next_stage, next_due_at, triage_due_at)
     SELECT CONCAT('DW-2026-', LPAD(seq, 6, '0')), ?, ? + seq - 1, ?, ELT(seq MOD 3 + 1, 'phone', 'email', 'tenant-online'),
            TIMESTAMP('2026-11-01') - INTERVAL seq MINUTE, 'Mould on the bedroom ceiling.', '["ceiling"]', '["mould-spots"]',
            ELT(seq MOD 4 + 1, 'hand', 'a4', 'door', 'larger'), seq MOD 7 = 0, ELT(seq MOD 8 + 1, ${statuses}),
            ELT(seq MOD 5 + 1, 'condensing', 'mould-risk', 'borderline', 'dry', NULL), IF(seq MOD 3 = 0, NULL, (seq MOD 60) / 10),
            IF(seq MOD 4 = 0, ELT(seq MOD 10 + 1, 'A','B','C','D','E','F','G','H','I','J'), NULL), IF(seq MOD 4 = 0, 1 + seq MOD 2, NULL),
            seq MOD 101, IF(seq MOD 6 = 0, NULL, 'investigate'),
            IF(seq MOD 6 = 0, NULL, TIMESTAMP('2026-12-10') + INTERVAL (seq MOD 30) DAY), NULL
     FROM seq_1_to_${ROWS}`,
    [org.id, first, admin.id],
  );
  const [{ caseId }] = (await ds.query("SELECT MIN(id) AS caseId FROM cases WHERE organisation_id = ?", [org.id])) as {
    caseId: number;
  }[];
  await ds.query(
    `INSERT INTO work_orders (organisation_id, case_id, type, description, room_ids, priority, target_date, status, created_by_id)
     SELECT ?, ? + seq MOD ${ROWS}, ELT(seq MOD 4 + 1, 'extractor-fan', 'mould-wash', 'trickle-vents', 'insulation'),
            'Fit a humidistat extractor fan.', '[]', ELT(seq MOD 3 + 1, 'emergency', 'urgent', 'routine'),
            DATE('2026-12-07') + INTERVAL (seq MOD 37) DAY, ELT(seq MOD 3 + 1, 'unscheduled', 'done', 'cancelled'), ?
     FROM seq_1_to_${ROWS}`,
    [org.id, caseId, admin.id],
  );
  // One case's readings: a logger in the bedroom every five minutes for a year (100 000 readings).
  const [{ roomId }] = (await ds.query("SELECT MIN(id) AS roomId FROM rooms WHERE property_id = ?", [first])) as {
    roomId: number;
  }[];
  await ds.query(
    `INSERT INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c,
                           outdoor_temperature_c, source)
     SELECT ?, ?, TIMESTAMP('2025-11-01') + INTERVAL seq * 5 MINUTE, 18 + (seq MOD 40) / 10, 55 + seq MOD 35,
            12 + (seq MOD 50) / 10, -3 + (seq MOD 120) / 10, 'import'
     FROM seq_0_to_${ROWS - 1}`,
    [caseId, roomId],
  );
  return { email: admin.email, caseId, roomId };
}

/** Child-process mode: the real app against the benchmark database until the parent stops it. */
async function serveApp(): Promise<void> {
  const ctx = await createAppContext(loadConfig(process.env));
  const server = createApp(ctx).listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const stop = async () => {
    server.closeAllConnections();
    server.close();
    await ctx.close();
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop());
  process.on("disconnect", () => void stop());
  process.send!({ port: (server.address() as AddressInfo).port });
}

interface ExportLog {
  export: string;
  format: string;
  rows: number;
  pages: number;
  firstPageMs: number;
  lastPageMs: number;
  maxPageMs: number;
}

async function startApp(db: { port: number; name: string; user: string; password: string }) {
  const child: ChildProcess = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), SERVE_FLAG], {
    env: {
      ...process.env,
      NODE_ENV: "test",
      // Info: the app's "export sent" line carries the page query times.
      LOG_LEVEL: "info",
      DB_HOST: "127.0.0.1",
      DB_PORT: String(db.port),
      DB_NAME: db.name,
      DB_USER: db.user,
      DB_PASSWORD: db.password,
    },
    stdio: ["ignore", "pipe", "inherit", "ipc"],
  });
  const exports: ExportLog[] = [];
  let partial = "";
  child.stdout!.setEncoding("utf8").on("data", (chunk: string) => {
    const lines = (partial + chunk).split("\n");
    partial = lines.pop() ?? "";
    for (const line of lines) {
      if (!line.includes('"export sent"')) continue;
      try {
        exports.push(JSON.parse(line) as ExportLog);
      } catch {
        // Not a JSON line: ignored.
      }
    }
  });
  const port = await new Promise<number>((resolve, reject) => {
    child.once("message", (m) => resolve((m as { port: number }).port));
    child.once("exit", (code) => reject(new Error(`The app exited before listening (exit ${code}).`)));
  });
  return { child, url: `http://127.0.0.1:${port}`, exports };
}

async function stopApp(app: { child: ChildProcess }): Promise<void> {
  if (app.child.exitCode !== null) return;
  const exited = new Promise((r) => app.child.once("exit", r));
  app.child.kill("SIGTERM");
  await exited;
}

/** The child's resident set now and its lifetime peak (kernel), in bytes. */
function rssOf(pid: number): { rss: number; hwm: number } {
  const status = readFileSync(`/proc/${pid}/status`, "utf8");
  const kb = (field: string) => Number(new RegExp(`^${field}:\\s+(\\d+) kB`, "m").exec(status)?.[1] ?? 0) * 1024;
  return { rss: kb("VmRSS"), hwm: kb("VmHWM") };
}

async function signIn(url: string, email: string): Promise<string> {
  const cookieOf = (res: Response) =>
    res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .find((c) => c.startsWith("dewline.sid="));
  const first = await fetch(`${url}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const res = await fetch(`${url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: cookieOf(first) ?? "" },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  const cookie = cookieOf(res);
  if (res.status !== 200 || !cookie) throw new Error(`Sign-in failed: ${res.status} ${await res.text()}`);
  return cookie;
}

async function download(url: string, cookie: string, pid: number) {
  let peak = rssOf(pid).rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, rssOf(pid).rss);
  }, 20);
  try {
    const start = performance.now();
    const res = await fetch(url, { headers: { cookie } });
    if (res.status !== 200 || !res.body) throw new Error(`Export failed: ${res.status} ${await res.text()}`);
    let bytes = 0;
    let lines = 0;
    for await (const chunk of res.body) {
      bytes += (chunk as Uint8Array).byteLength;
      for (const b of chunk as Uint8Array) if (b === 10) lines += 1;
    }
    return { ms: performance.now() - start, bytes, lines, peakMb: Math.max(peak, rssOf(pid).rss) / MB };
  } finally {
    clearInterval(timer);
  }
}

async function main(): Promise<void> {
  const bench = await startBenchDatabase("export");
  const { db, ds } = bench;
  let app: Awaited<ReturnType<typeof startApp>> | undefined;
  try {
    const t0 = performance.now();
    const { email, caseId, roomId } = await seed(ds);
    await ds.destroy();
    console.log(
      `Export benchmark — ${ROWS.toLocaleString("en-GB")} rows a table (inserted in ${((performance.now() - t0) / 1000).toFixed(1)} s); ` +
        "the app in a child process, its RSS read from /proc",
    );

    console.log(
      "  table          fmt     time     size   rows/s   RSS before → peak   pages  first page  last page  slowest page",
    );
    const views: [string, string][] = [
      ["queue", "/api/cases/export?"],
      ["homes", "/api/properties/export?"],
      ["work orders", "/api/work-orders/export?"],
      ["accounts", "/api/users/export?"],
      // As the case page's link asks (the room shown), and every room of the case.
      ["readings", `/api/cases/${caseId}/readings/export?roomId=${roomId}&`],
      ["readings, all", `/api/cases/${caseId}/readings/export?`],
    ];
    let failed = false;
    for (const [name, route] of views) {
      for (const format of ["csv", "xlsx"] as const) {
        // A fresh app for each export, so each peak is that export's own (V8 keeps what it grew to).
        app = await startApp(db);
        const pid = app.child.pid!;
        const cookie = await signIn(app.url, email);
        const before = rssOf(pid).rss / MB;
        const r = await download(`${app.url}${route}format=${format}`, cookie, pid);
        // The log line is written once the last byte is sent: wait for it to arrive.
        for (let i = 0; i < 100 && app.exports.length === 0; i += 1) await new Promise((res) => setTimeout(res, 20));
        const log = app.exports[0];
        const rows = log?.rows ?? -1;
        if (rows !== ROWS || (format === "csv" && r.lines !== ROWS + 1)) failed = true;
        const ms = (v: number | undefined) => (v === undefined ? "?" : `${v.toFixed(1)} ms`).padStart(9);
        console.log(
          `  ${name.padEnd(13)} ${format.padEnd(4)} ${(r.ms / 1000).toFixed(2).padStart(6)} s ${(r.bytes / MB).toFixed(1).padStart(6)} MB ` +
            `${Math.round((ROWS / r.ms) * 1000)
              .toLocaleString("en-GB")
              .padStart(
                8,
              )} ${before.toFixed(0).padStart(6)} → ${r.peakMb.toFixed(0).padStart(3)} MB ${String(log?.pages ?? "?").padStart(6)} ` +
            `${ms(log?.firstPageMs)}  ${ms(log?.lastPageMs)}  ${ms(log?.maxPageMs)}` +
            (rows === ROWS ? "" : `   ROWS: ${rows} of ${ROWS}`),
        );
        await stopApp(app);
        app = undefined;
      }
    }
    console.log("  (target: peak RSS < 300 MB)");
    if (failed) {
      console.error("An export did not hold every row.");
      process.exitCode = 1;
    }
  } finally {
    if (app) await stopApp(app);
    await bench.stop();
  }
}

if (process.argv.includes(SERVE_FLAG)) {
  serveApp().catch((error: unknown) => {
    console.error(error);
    process.exit(1);
  });
} else {
  main().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
