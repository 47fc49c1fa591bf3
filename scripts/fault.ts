// Load and fault checks (`npm run fault`). Starts its own MariaDB (temporary directory, free port),
// an in-process SMTP catcher and the built server (`node dist-server/server/server.js`, built first
// when missing), seeds one landlord with staff and homes, then runs the phases and prints a table each:
//  a. load: autocannon, tenants writing (reports, messages) and reading, officers reading the queue
//     and cases → requests, error rate, p50/p99;
//  b. MariaDB SIGSTOPped for 5 s during writes, then SIGCONT;
//  c. MariaDB SIGKILLed during writes, then started again;
//     for b and c: writes acknowledged vs rows in the database, lost (acknowledged, no row),
//     duplicated, answered 5xx or not at all yet committed, 503s, time to the first good write after;
//  d. the mail server stopped while e-mails are queued, then started → queued vs delivered, duplicates;
//  e. kill -9 of the server in the middle of a large reading import, then a restart → rows the
//     killed import left behind (should be 0) and whether the server came back;
//  f. ratios measured side by side: /api/auth/me throughput over /api/health; /api/auth/me p99
//     while an anonymous client posts maximal /api/psychrometrics/series requests, over idle p99.
// Ends with a one-line verdict. It only prints: the figures depend on the machine. Uses real time
// for load and outages, never the calendar. Options: --seconds <n> per load run (default 10);
// --only <letters> runs only those phases (e.g. --only f); --keep keeps the work folder;
// --profile <folder> has the server write a CPU profile there when it stops.
import { spawn, type ChildProcess } from "node:child_process";
import { createWriteStream, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { cpus, loadavg, setPriority, tmpdir } from "node:os";
import path from "node:path";
import { setTimeout as sleep } from "node:timers/promises";
import mysql from "mysql2/promise";
import { SMTPServer } from "smtp-server";
import { seedFaultLandlord } from "./lib/fault-landlord.js";
import { load, printTable, quantile, Session, type LoadResult } from "./lib/http-load.js";
import { ensureAppDatabase, freePort, rootSql, runningPid, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { projectRoot } from "./lib/paths.js";
import { runStep, stopChild, waitUntilReady } from "./lib/processes.js";

const argv = process.argv.slice(2);
const secondsArg = argv.indexOf("--seconds");
const SECONDS = secondsArg === -1 ? 10 : Number(argv[secondsArg + 1]);
if (!Number.isInteger(SECONDS) || SECONDS <= 0) throw new Error("--seconds needs a whole number above 0.");
const onlyArg = argv.indexOf("--only");
const ONLY = onlyArg === -1 ? "abcdef" : (argv[onlyArg + 1] ?? "");
if (!/^[a-f]+$/.test(ONLY)) throw new Error("--only needs phase letters from a to f, e.g. --only f.");
const runs = (phase: string) => ONLY.includes(phase);
const profileArg = argv.indexOf("--profile");
/** --profile <folder>: the server writes a V8 CPU profile there when it stops (open it in Chrome's DevTools). */
const serverNodeArgs =
  profileArg === -1 ? [] : ["--cpu-prof", "--cpu-prof-dir", path.resolve(argv[profileArg + 1] ?? "profiles")];
const HOMES = 12;
const PASSWORD = "fault-script-only-password";
const WRITERS = 6;
const IMPORT_ROWS = 600_000;
const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);

// ---------------------------------------------------------------------------------------------
// The pieces: database, mail catcher, server

const work = mkdtempSync(path.join(tmpdir(), "dewline-fault-"));
mkdirSync(path.join(work, "tmp"));
const dbDir = path.join(work, "mariadb");
const db = { name: "dewline_fault", user: "dewline_fault", password: "fault-only-password" };
let dbPort = 0;
let appPort = 0;
let smtpPort = 0;
let base = "";
let server: ChildProcess | undefined;
let pool: mysql.Pool | undefined;

/** The in-process SMTP catcher: every message's raw text, kept across stops and starts. */
const caught: string[] = [];
let smtp: SMTPServer | undefined;
async function startSmtp() {
  smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        caught.push(Buffer.concat(chunks).toString("utf8"));
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => smtp!.listen(smtpPort, "127.0.0.1", () => resolve()));
}
async function stopSmtp() {
  const s = smtp;
  smtp = undefined;
  if (s) await new Promise<void>((resolve) => s.close(() => resolve()));
}

const serverEnv = () => ({
  ...process.env,
  NODE_ENV: "development",
  HOST: "127.0.0.1",
  PORT: String(appPort),
  APP_URL: base,
  DB_PORT: String(dbPort),
  DB_NAME: db.name,
  DB_USER: db.user,
  DB_PASSWORD: db.password,
  SMTP_PORT: String(smtpPort),
  UPLOADS_DIR: path.join(work, "uploads"),
  // The server's upload temp folder is under the OS temp dir: give it its own, so phase e counts only its files.
  TMPDIR: path.join(work, "tmp"),
  LOG_LEVEL: "warn",
});

async function startServer() {
  const log = createWriteStream(path.join(work, "server.log"), { flags: "a" });
  server = spawn(process.execPath, [...serverNodeArgs, "dist-server/server/server.js"], {
    cwd: projectRoot,
    env: serverEnv(),
    stdio: "pipe",
  });
  server.stdout?.pipe(log);
  server.stderr?.pipe(log);
  await waitUntilReady(`${base}/api/health/ready`, 60_000);
}

const sql = async <T = Record<string, unknown>>(query: string, params: unknown[] = []) =>
  (await pool!.query(query, params))[0] as T[];
const mariaDbPid = () => {
  const pid = runningPid(dbDir);
  if (pid === null) throw new Error("MariaDB is not running");
  return pid;
};

async function shutdown() {
  if (server) await stopChild(server, 15_000);
  await stopSmtp();
  await pool?.end().catch(() => undefined);
  const pid = runningPid(dbDir);
  if (pid !== null) process.kill(pid, "SIGCONT");
  await stopMariaDb(dbDir);
  if (argv.includes("--keep")) console.log(`(work folder kept: ${work})`);
  else rmSync(work, { recursive: true, force: true });
}

// ---------------------------------------------------------------------------------------------
// Seeding: one landlord, its staff and homes, each with a tenant

const seed = () =>
  seedFaultLandlord(
    { ...db, port: dbPort },
    {
      name: "Fernlea Homes (fault script)",
      emailDomain: "fault.example",
      namePrefix: "Fault",
      password: PASSWORD,
      officers: 1,
      otherStaff: ["maintenance"],
      homes: HOMES,
      street: "Quillon Street",
      home: {
        town: "Fernlea",
        postcode: "ZX9 9AA",
        estate: "Quillon",
        builtForm: "mid-terrace",
        wallType: "solid-brick",
        glazingType: "modern-double",
        heatingType: "gas-boiler",
      },
      rooms: [
        { name: "Bedroom", kind: "bedroom" },
        { name: "Kitchen", kind: "kitchen" },
      ],
    },
  );

const report = (token: string, roomId: number) => ({
  description: `${token} Black mould on the bedroom wall by the window.`,
  locations: ["external-wall"],
  observations: ["mould-spots"],
  roomIds: [roomId],
});

// ---------------------------------------------------------------------------------------------
// b and c: writes through a fault

interface Attempt {
  token: string;
  sentAt: number;
  status: number | "no answer";
}

/** WRITERS tenants each posting reports one after another until stopped; each report carries a unique token. */
function writers(sessions: { s: Session; roomId: number }[], prefix: string) {
  const attempts: Attempt[] = [];
  let running = true;
  let n = 0;
  const loops = sessions.map(async ({ s, roomId }) => {
    while (running) {
      const token = `${prefix}-${String(++n).padStart(5, "0")}`;
      const attempt: Attempt = { token, sentAt: performance.now(), status: "no answer" };
      attempts.push(attempt);
      try {
        attempt.status = (await s.request("POST", "/api/cases", report(token, roomId))).status;
      } catch {
        await sleep(100);
      }
    }
  });
  return {
    attempts,
    async stop() {
      running = false;
      await Promise.all(loops);
    },
  };
}

async function faultFigures(name: string, attempts: Attempt[], prefix: string, resumedAt: number) {
  const rows = await sql<{ description: string }>("SELECT description FROM cases WHERE description LIKE ?", [`${prefix}-%`]);
  const count = new Map<string, number>();
  for (const r of rows) {
    const token = r.description.split(" ")[0]!;
    count.set(token, (count.get(token) ?? 0) + 1);
  }
  const ok = (a: Attempt) => typeof a.status === "number" && a.status >= 200 && a.status < 300;
  const acked = attempts.filter(ok);
  const firstGood = attempts.filter((a) => a.sentAt >= resumedAt && ok(a)).sort((a, b) => a.sentAt - b.sentAt)[0];
  const failedButCommitted = attempts.filter((a) => !ok(a) && (count.get(a.token) ?? 0) > 0);
  return {
    phase: name,
    attempts: attempts.length,
    acked: acked.length,
    rows: rows.length,
    lost: acked.filter((a) => !count.get(a.token)).length,
    duplicated: [...count.values()].filter((c) => c > 1).length,
    "5xx/none but committed": failedButCommitted.length,
    "500s": attempts.filter((a) => a.status === 500).length,
    "503s": attempts.filter((a) => a.status === 503).length,
    "no answer": attempts.filter((a) => a.status === "no answer").length,
    "recovered in s": firstGood ? ((firstGood.sentAt - resumedAt) / 1000).toFixed(1) : "never",
  };
}

async function throughFault(
  name: string,
  prefix: string,
  sessions: { s: Session; roomId: number }[],
  fault: () => Promise<void>,
) {
  const w = writers(sessions, prefix);
  await sleep(2000);
  await fault();
  const resumedAt = performance.now();
  // Keep writing until a write sent after the fault succeeds (or 30 s), then a little more.
  const deadline = resumedAt + 30_000;
  while (performance.now() < deadline && !w.attempts.some((a) => a.sentAt >= resumedAt && a.status === 201)) await sleep(200);
  await sleep(2000);
  await w.stop();
  return faultFigures(name, w.attempts, prefix, resumedAt);
}

// ---------------------------------------------------------------------------------------------
// f: the server's CPU time, and the anonymous flood in a process of its own

/** The calculator's largest series for an anonymous caller (the server's default, CALCULATOR_MAX_ANONYMOUS_READINGS). */
const MAX_ANONYMOUS_READINGS = 10_000;
const CLOCK_TICKS = 100; // USER_HZ on Linux: /proc/<pid>/stat counts CPU time in these

/** CPU seconds (user + system, every thread) the server process has used so far. */
function serverCpuSeconds(): number {
  const stat = readFileSync(`/proc/${server!.pid}/stat`, "utf8");
  const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
  return (Number(fields[11]) + Number(fields[12])) / CLOCK_TICKS;
}

/** Runs `work` and hands `seconds` the server CPU time it took. */
async function measured<T>(work: () => Promise<T>, seconds: (s: number) => void): Promise<T> {
  const before = serverCpuSeconds();
  const result = await work();
  seconds(serverCpuSeconds() - before);
  return result;
}

/**
 * Starts scripts/lib/series-flood.ts: 4 connections posting `readings`-reading series from one address.
 * It runs at the lowest CPU priority, standing in for a client on another machine (its own CPU time
 * is not the server's); stop() ends it and returns the answers it got.
 */
async function startFlood(readings: number) {
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/lib/series-flood.ts", base, String(readings), "4"], {
    cwd: projectRoot,
    stdio: ["ignore", "pipe", "inherit"],
  });
  setPriority(child.pid!, 19);
  let out = "";
  child.stdout!.on("data", (chunk: Buffer) => (out += chunk.toString()));
  while (!out.includes("flooding")) {
    if (child.exitCode !== null) throw new Error("the series flood stopped before it started");
    await sleep(100);
  }
  await sleep(1000);
  return {
    async stop(): Promise<Record<string, number>> {
      const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
      child.kill("SIGTERM");
      await exited;
      return JSON.parse(out.trim().split("\n").at(-1)!) as Record<string, number>;
    },
  };
}

// ---------------------------------------------------------------------------------------------

try {
  console.log(
    `Machine: ${cpus().length} cores, load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(" ")}`,
  );
  if (!existsSync(path.join(projectRoot, "dist-server/server/server.js"))) {
    step("Building the server (tsc → dist-server)…");
    await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], {
      cwd: projectRoot,
    });
  }
  [dbPort, appPort, smtpPort] = [await freePort(), await freePort(), await freePort()];
  base = `http://127.0.0.1:${appPort}`;
  step(`MariaDB on 127.0.0.1:${dbPort} (data in ${dbDir})…`);
  await startMariaDb({ dir: dbDir, port: dbPort });
  await ensureAppDatabase({ dir: dbDir, port: dbPort }, db);
  await startSmtp();
  step("Migrating and seeding…");
  await runStep(process.execPath, ["dist-server/server/migrate.js"], { cwd: projectRoot, env: serverEnv(), stdio: "ignore" });
  const seeded = await seed();
  pool = mysql.createPool({
    host: "127.0.0.1",
    port: dbPort,
    user: db.user,
    password: db.password,
    database: db.name,
    connectionLimit: 2,
  });
  step(`Starting the server on ${base}…`);
  await startServer();

  const officer = await Session.signIn(base, seeded.officers[0]!, PASSWORD);
  // One after another: the per-address sign-in limit counts requests still running as failures.
  const tenants: { s: Session; roomId: number }[] = [];
  for (const t of seeded.tenants) tenants.push({ s: await Session.signIn(base, t.email, PASSWORD), roomId: t.roomId });
  // Each tenant's first report, so there are cases to write to and read.
  const caseIds: number[] = [];
  for (const [i, t] of tenants.entries())
    caseIds.push(((await (await t.s.request("POST", "/api/cases", report(`SEED-${i}`, t.roomId))).json()) as { id: number }).id);

  type FaultRow = Awaited<ReturnType<typeof faultFigures>>;
  let stall: FaultRow | null = null;
  let crash: FaultRow | null = null;
  let mailFigures: { "queued (201s)": number; delivered: number; "duplicated (token)": number } | null = null;
  let importLeft: number | null = null;
  const start = Date.UTC(2025, 0, 1);
  if (runs("a")) {
    // a. Load -------------------------------------------------------------------------------------
    step(`a. Load: ${SECONDS} s of reads and writes…`);
    const [t0, t1] = tenants;
    const at = (h: number) => `2026-01-01T${String(h).padStart(2, "0")}:00:00Z`;
    const mix: [string, Promise<LoadResult>][] = [
      [
        "tenant: report + message + my cases",
        load(
          base,
          [
            { method: "POST", path: "/api/cases", body: JSON.stringify(report("LOAD", t0!.roomId)) },
            {
              method: "POST",
              path: `/api/cases/${caseIds[0]}/messages`,
              body: JSON.stringify({ body: "Any news on the mould?" }),
            },
            { method: "GET", path: "/api/me/cases" },
          ],
          { seconds: SECONDS, connections: 2, headers: t0!.s.headers },
        ),
      ],
      [
        "tenant: readings + case",
        load(
          base,
          [
            {
              method: "POST",
              path: `/api/cases/${caseIds[1]}/readings`,
              body: JSON.stringify([{ roomId: t1!.roomId, takenAt: at(8), airTemperatureC: 18, relativeHumidityPct: 75 }]),
            },
            { method: "GET", path: `/api/cases/${caseIds[1]}` },
          ],
          { seconds: SECONDS, connections: 2, headers: t1!.s.headers },
        ),
      ],
      [
        "officer: queue + case + events",
        load(
          base,
          [
            { method: "GET", path: "/api/cases?status=open" },
            { method: "GET", path: `/api/cases/${caseIds[2]}` },
            { method: "GET", path: `/api/cases/${caseIds[2]}/events` },
          ],
          { seconds: SECONDS, connections: 4, headers: officer.headers },
        ),
      ],
    ];
    const loadRows = [];
    for (const [who, running] of mix) {
      const r = await running;
      loadRows.push({
        who,
        requests: r.requests,
        "req/s": r.rps,
        "error %": (100 * r.errors) / Math.max(1, r.requests),
        p50: r.p50,
        p99: r.p99,
      });
    }
    printTable("a. Load (latency in ms)", loadRows);
  }
  // b, c. Database stalled, then killed -----------------------------------------------------------
  const writing = tenants.slice(0, WRITERS);
  if (runs("b")) {
    step("b. MariaDB stopped (SIGSTOP) for 5 s during writes…");
    stall = await throughFault("b. SIGSTOP 5 s", "STALL", writing, async () => {
      const pid = mariaDbPid();
      process.kill(pid, "SIGSTOP");
      await sleep(5000);
      process.kill(pid, "SIGCONT");
    });
  }
  if (runs("c")) {
    step("c. MariaDB killed (SIGKILL) during writes, then started again…");
    crash = await throughFault("c. SIGKILL + restart", "CRASH", writing, async () => {
      process.kill(mariaDbPid(), "SIGKILL");
      await sleep(1000);
      await startMariaDb({ dir: dbDir, port: dbPort });
    });
    // Our own connections died with the database: open new ones.
    await pool.end().catch(() => undefined);
    pool = mysql.createPool({
      host: "127.0.0.1",
      port: dbPort,
      user: db.user,
      password: db.password,
      database: db.name,
      connectionLimit: 2,
    });
  }
  if (stall || crash)
    printTable(
      "b, c. Writes through a database fault",
      [stall, crash].filter((r) => r !== null),
    );

  if (runs("d")) {
    // d. Mail server down -------------------------------------------------------------------------
    step("d. Mail server stopped while e-mails are queued…");
    caught.length = 0;
    const sent: string[] = [];
    const message = async (k: number) => {
      const token = `MAIL${String(k).padStart(4, "0")}X`;
      const res = await officer
        .request("POST", `/api/cases/${caseIds[k % caseIds.length]}/messages`, {
          body: `Update ${token}: we will call to book the work.`,
          internal: false,
        })
        .catch(() => null);
      if (res?.status === 201) sent.push(token);
    };
    let k = 0;
    for (; k < 10; k++) await message(k);
    await stopSmtp();
    for (; k < 25; k++) await message(k);
    await sleep(2000);
    await startSmtp();
    for (; k < 35; k++) await message(k);
    // Give the relay time to catch up: failed attempts are retried after 30 s, then 60 s…, so wait
    // until every acknowledged message has arrived, at most 150 s.
    const arrived = () => sent.every((tk) => caught.some((raw) => raw.replace(/=\r?\n/g, "").includes(tk)));
    const waitStart = Date.now();
    while (!arrived() && Date.now() - waitStart < 150_000) await sleep(1_000);
    console.log(`  (all delivered ${arrived() ? "" : "NOT "}after ${((Date.now() - waitStart) / 1000).toFixed(0)} s of waiting)`);
    const bodies = caught.map((raw) => raw.replace(/=\r?\n/g, ""));
    const delivered = new Map<string, number>();
    for (const raw of bodies) {
      const token = /MAIL\d{4}X/.exec(raw)?.[0];
      if (token) delivered.set(token, (delivered.get(token) ?? 0) + 1);
    }
    const messageIds = bodies.map((raw) => /^Message-ID:\s*(.+)$/im.exec(raw)?.[1]?.trim()).filter(Boolean);
    const outbox = await sql<{ status: string; n: number }>(
      "SELECT status, COUNT(*) AS n FROM outbox_emails WHERE template = 'caseMessage' GROUP BY status",
    );
    const mailRow = {
      "queued (201s)": sent.length,
      delivered: sent.filter((t) => delivered.has(t)).length,
      "never delivered": sent.filter((t) => !delivered.has(t)).length,
      "duplicated (token)": [...delivered.values()].filter((c) => c > 1).length,
      "duplicated (Message-ID)": messageIds.length - new Set(messageIds).size,
      "outbox rows": outbox.map((o) => `${o.status} ${o.n}`).join(", "),
    };
    printTable("d. E-mails across a mail-server outage (15 of 35 written while it was down)", [mailRow]);
    mailFigures = mailRow;
    if (mailRow["never delivered"] > 0) {
      const stuck = await sql<{ status: string; attempts: number; error: string | null }>(
        "SELECT status, attempts, LEFT(error, 120) AS error FROM outbox_emails WHERE template = 'caseMessage' AND status <> 'sent' ORDER BY id LIMIT 3",
      );
      for (const r of stuck)
        console.log(`  not delivered: ${r.status}, ${r.attempts} attempt(s), ${r.error ?? "no error recorded"}`);
    }
  }
  if (runs("e")) {
    // e. Server killed mid-import -----------------------------------------------------------------
    step(`e. kill -9 of the server in the middle of a ${IMPORT_ROWS.toLocaleString("en-GB")}-row import…`);
    const csvPath = path.join(work, "logger.csv");
    const lines = ["Time,Temperature,RH"];
    for (let i = 0; i < IMPORT_ROWS; i++)
      lines.push(
        `${new Date(start + i * 60_000).toISOString().slice(0, 19).replace("T", " ")}Z,${(18 + (i % 40) / 10).toFixed(1)},${60 + (i % 30)}`,
      );
    writeFileSync(csvPath, lines.join("\n"));
    const importCase = caseIds[3]!;
    const form = new FormData();
    form.set("roomId", String(tenants[3]!.roomId));
    form.set("file", new Blob([readFileSync(csvPath)]), "logger.csv");
    const importing = tenants[3]!.s.request("POST", `/api/cases/${importCase}/readings/import`, form, 300_000).then(
      (r) => r.status,
      () => "no answer",
    );
    // Wait until the import's transaction has written rows (seen from MariaDB's side), then kill.
    let modified = 0;
    const importDeadline = performance.now() + 120_000;
    while (modified < 50_000 && performance.now() < importDeadline) {
      modified = Number(
        (
          await rootSql(
            { dir: dbDir, port: dbPort },
            "SELECT COALESCE(MAX(trx_rows_modified),0) FROM information_schema.innodb_trx",
          )
        ).trim(),
      );
      await sleep(50);
    }
    const killedAt = performance.now();
    server!.kill("SIGKILL");
    const answer = await importing;
    await new Promise<void>((resolve) =>
      server!.exitCode !== null || server!.signalCode !== null ? resolve() : server!.once("exit", () => resolve()),
    );
    await startServer();
    const backIn = (performance.now() - killedAt) / 1000;
    // The rolled-back transaction is undone by MariaDB; wait for it to finish before counting.
    while (Number((await rootSql({ dir: dbDir, port: dbPort }, "SELECT COUNT(*) FROM information_schema.innodb_trx")).trim()) > 0)
      await sleep(200);
    const [left] = await sql<{ readings: number; imports: number }>(
      "SELECT (SELECT COUNT(*) FROM readings WHERE case_id = ? AND import_id IS NOT NULL) AS readings, (SELECT COUNT(*) FROM reading_imports WHERE case_id = ?) AS imports",
      [importCase, importCase],
    );
    // The upload is received into the app's own incoming folder (crash leftovers are swept once stale).
    const incoming = path.join(work, "uploads", ".incoming");
    const tmpLeft = existsSync(incoming) ? readdirSync(incoming).length : 0;
    const meAfter = await Session.signIn(base, seeded.tenants[3]!.email, PASSWORD).then(
      (s) => s.request("GET", "/api/auth/me").then((r) => r.status),
      () => "sign-in failed",
    );
    importLeft = Number(left!.readings);
    printTable("e. Server killed mid-import", [
      {
        "rows written when killed": modified,
        "import answer": String(answer),
        "readings left": Number(left!.readings),
        "import rows left": Number(left!.imports),
        "upload temp files left": tmpLeft,
        "back in s": backIn,
        "/api/auth/me after": String(meAfter),
      },
    ]);
  }
  if (runs("f")) {
    // f. Ratios ----------------------------------------------------------------------------------
    step(`f. Ratios: health vs me, me idle vs under a series flood (${SECONDS} s runs)…`);
    const me = await Session.signIn(base, seeded.tenants[4]!.email, PASSWORD);
    const half = Math.max(1, Math.round(SECONDS / 2));
    const health: LoadResult[] = [];
    const mine: LoadResult[] = [];
    const cpu = { health: 0, me: 0 };
    for (let round = 0; round < 2; round++) {
      health.push(
        await measured(
          () => load(base, [{ method: "GET", path: "/api/health" }], { seconds: half, connections: 10 }),
          (s) => (cpu.health += s),
        ),
      );
      mine.push(
        await measured(
          () => load(base, [{ method: "GET", path: "/api/auth/me" }], { seconds: half, connections: 10, headers: me.headers }),
          (s) => (cpu.me += s),
        ),
      );
    }
    const rps = (rs: LoadResult[]) => rs.reduce((sum, r) => sum + r.rps, 0) / rs.length;
    const total = (rs: LoadResult[]) => rs.reduce((sum, r) => sum + r.requests, 0);
    const meUnder = (headers: Record<string, string>) =>
      load(base, [{ method: "GET", path: "/api/auth/me" }], { seconds: SECONDS, connections: 2, headers });
    let idleCpu = 0;
    const idle = await measured(
      () => meUnder(me.headers),
      (s) => (idleCpu = s),
    );
    // Two floods from one address, 4 connections each: the largest series an anonymous caller may send
    // (evaluated until the address's budget runs out), and a 100 000-reading one (refused from its header).
    const floods = [];
    for (const readings of [MAX_ANONYMOUS_READINGS, 100_000]) {
      const flood = await startFlood(readings);
      let floodCpu = 0;
      const busy = await measured(
        () => meUnder(me.headers),
        (s) => (floodCpu = s),
      );
      floods.push({ readings, busy, floodCpu, answers: await flood.stop() });
    }
    printTable("f. Side by side (latency in ms; server CPU in seconds, all its threads)", [
      {
        run: "/api/health (2 rounds)",
        "req/s": rps(health),
        p50: health[0]!.p50,
        p99: quantile(
          health.map((h) => h.p99),
          1,
        ),
        "CPU ms/request": (1000 * cpu.health) / Math.max(1, total(health)),
      },
      {
        run: "/api/auth/me (2 rounds)",
        "req/s": rps(mine),
        p50: mine[0]!.p50,
        p99: quantile(
          mine.map((h) => h.p99),
          1,
        ),
        "CPU ms/request": (1000 * cpu.me) / Math.max(1, total(mine)),
      },
      {
        run: "/api/auth/me idle, 2 conns",
        "req/s": idle.rps,
        p50: idle.p50,
        p99: idle.p99,
        "CPU ms/request": (1000 * idleCpu) / Math.max(1, idle.requests),
      },
      ...floods.map((f) => ({
        run: `/api/auth/me, ${f.readings.toLocaleString("en-GB")}-reading flood`,
        "req/s": f.busy.rps,
        p50: f.busy.p50,
        p99: f.busy.p99,
        "CPU ms/request": (1000 * f.floodCpu) / Math.max(1, f.busy.requests),
      })),
    ]);
    console.log(`  me/health throughput: ${(rps(mine) / rps(health)).toFixed(2)}× (target ≥ 0.8×)`);
    for (const f of floods) {
      console.log(
        `  me p99 under the ${f.readings.toLocaleString("en-GB")}-reading flood / idle: ×${(f.busy.p99 / Math.max(idle.p99, 1)).toFixed(1)} (target ≤ ×3); ` +
          `flood answers ${Object.entries(f.answers)
            .map(([status, n]) => `${status}×${n}`)
            .join(", ")}; ` +
          `server CPU ${f.floodCpu.toFixed(1)} s in ${SECONDS} s`,
      );
    }
  }

  // Verdict ------------------------------------------------------------------------------------
  const faults = [stall, crash].filter((r) => r !== null);
  const verdict = [
    faults.length ? `${faults.reduce((n, r) => n + r.lost, 0)} lost` : null,
    faults.length || mailFigures
      ? `${faults.reduce((n, r) => n + r.duplicated, 0) + (mailFigures?.["duplicated (token)"] ?? 0)} duplicated`
      : null,
    faults.length ? `${faults.reduce((n, r) => n + r["5xx/none but committed"], 0)} failed-but-committed writes` : null,
    mailFigures ? `${mailFigures.delivered}/${mailFigures["queued (201s)"]} mails delivered` : null,
    importLeft !== null ? `${importLeft} rows left by the killed import` : null,
  ].filter((part) => part !== null);
  if (verdict.length) console.log(`\nVerdict: ${verdict.join(", ")}.`);
  await shutdown();
} catch (error) {
  console.error(`\nnpm run fault failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
  console.error(`(server log: ${path.join(work, "server.log")}, kept)`);
  if (server) await stopChild(server, 5000);
  await stopSmtp();
  await pool?.end().catch(() => undefined);
  const pid = runningPid(dbDir);
  if (pid !== null) process.kill(pid, "SIGCONT");
  await stopMariaDb(dbDir);
  process.exitCode = 1;
}
