// `npm run test:faults`: the cluster under faults, everything on 127.0.0.1 in a temporary folder.
// Starts three Galera nodes, HAProxy (database front: one writer at a time; HTTP front over two app
// instances), seeds one landlord, then runs a mixed load through the HTTP front — tenants reporting,
// sending messages and entering hand readings, two sensors posting readings, officers reading the
// queue, and officers racing each other to move the same new cases on — while it:
//   1. SIGKILLs the Galera node taking the writes → error rate, time until writes succeed again;
//   2. restarts that node (position recovered, then IST) → time until it is Synced;
//   3. SIGKILLs an app instance → error rate, time until the front stops sending to it;
//   4. restarts that instance → time until the front sends to it again.
// Every create carries an Idempotency-Key and is retried with the same key after a network error or
// a 5xx. Then it counts: acknowledged writes with no row (lost), keys with two rows (duplicated), races
// with more than one winner (lost updates), reads after an acknowledged write that missed it (stale,
// read through the other instance). Last, a `mariadb-dump --single-transaction` of the cluster is
// restored into a fresh three-node cluster and the tables are counted on both.
// Prints the tables and exits 1 on any loss, duplicate, lost update or count mismatch. Real time is used
// for the load and the outages only; readings carry fixed or relative times, never "today".
// Options: --keep keeps the work folder (logs of every node, HAProxy and app).
import { spawn } from "node:child_process";
import { chmodSync, createReadStream, createWriteStream, mkdtempSync, rmSync } from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { setTimeout as sleep } from "node:timers/promises";
import mysql from "mysql2/promise";
import { SMTPServer } from "smtp-server";
import { startAppInstance, type AppInstance } from "./lib/app-instances.js";
import { startS3StandIn, type S3StandIn } from "./lib/s3-stand-in.js";
import {
  GALERA,
  galeraCluster,
  killNode,
  nodePid,
  nodeSocket,
  nodeStatus,
  rejoinNode,
  startCluster,
  stopCluster,
  waitForExit,
  type GaleraCluster,
} from "./lib/galera.js";
import { seedFaultLandlord, type SeededLandlord } from "./lib/fault-landlord.js";
import { activeDbNode, startHaproxy, type Haproxy } from "./lib/haproxy.js";
import { printTable, Session } from "./lib/http-load.js";
import { ensureAppDatabase, freePort } from "./lib/mariadb.js";
import { projectRoot } from "./lib/paths.js";
import { runStep, stopChild } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB } from "./lib/system-packages.js";

const argv = process.argv.slice(2);
const KEEP = argv.includes("--keep");
const PASSWORD = "faults-script-only-password";
const TENANTS = 6;
const OFFICERS = 2;
const RACERS = 4;
const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);
const elapsed = (from: number) => (performance.now() - from) / 1000;
const started = performance.now();

const work = mkdtempSync(path.join(tmpdir(), "dewline-faults-"));
// The Galera nodes run as the mysql user, which must be able to enter the folder (mkdtemp makes it 0700).
chmodSync(work, 0o711);
const db = { name: "dewline_faults", user: "dewline_faults", password: "faults-only-password" };
const clusters: GaleraCluster[] = [];
let haproxy: Haproxy | undefined;
const apps: (AppInstance | undefined)[] = [];
let pool: mysql.Pool | undefined;
let smtp: SMTPServer | undefined;
let objectStore: S3StandIn | undefined;

async function newCluster(name: string): Promise<GaleraCluster> {
  const ports = async () => [await freePort(), await freePort(), await freePort()];
  const cluster = galeraCluster(path.join(work, name), {
    sql: await ports(),
    gcomm: await ports(),
    ist: await ports(),
    sst: await ports(),
  });
  clusters.push(cluster);
  return cluster;
}

async function shutdown() {
  await Promise.all(apps.map((a) => (a ? stopChild(a.child, 15_000) : undefined)));
  await pool?.end().catch(() => undefined);
  await haproxy?.stop();
  if (smtp) await new Promise<void>((resolve) => smtp!.close(() => resolve()));
  await objectStore?.stop();
  for (const cluster of clusters) await stopCluster(cluster).catch((e: unknown) => console.error(String(e)));
  if (KEEP) console.log(`(work folder kept: ${work})`);
  else rmSync(work, { recursive: true, force: true });
}

// ---------------------------------------------------------------------------------------------
// Requests through the front: every answer and failure is logged with its time, for the error rates

interface Sample {
  at: number;
  failed: boolean;
}
const samples: Sample[] = [];

interface Answer {
  status: number;
  body: unknown;
  servedBy: string | null;
  attempts: number;
}

/** One request; a network error, a timeout or a 5xx counts as failed. Never throws. */
async function once(s: Session, method: string, url: string, body: unknown, headers: Record<string, string> = {}) {
  const at = performance.now();
  try {
    const res = await fetch(`${s.base}${url}`, {
      method,
      headers: { ...s.headers, "content-type": "application/json", ...headers },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(15_000),
    });
    const text = await res.text();
    samples.push({ at, failed: res.status >= 500 });
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      // not JSON: keep the text
    }
    return { status: res.status, body: parsed, servedBy: res.headers.get("x-served-by") };
  } catch {
    samples.push({ at, failed: true });
    return { status: 0, body: null, servedBy: null };
  }
}

/** A write: retried with the same Idempotency-Key after a network error or a 5xx, for up to 45 s. */
async function write(s: Session, method: string, url: string, body: unknown, key: string): Promise<Answer> {
  const deadline = performance.now() + 45_000;
  for (let attempts = 1; ; attempts++) {
    const a = await once(s, method, url, body, { "idempotency-key": key });
    if ((a.status > 0 && a.status < 500) || performance.now() > deadline) return { ...a, attempts };
    await sleep(Math.min(1000, 100 * attempts));
  }
}

// ---------------------------------------------------------------------------------------------
// Seeding: one landlord, staff, homes each with a tenant, two sensors

type Seeded = SeededLandlord;

const seed = (port: number) =>
  seedFaultLandlord(
    { ...db, port },
    {
      name: "Harrowgate Lettings (fault test)",
      emailDomain: "faults.example",
      namePrefix: "Faults",
      password: PASSWORD,
      officers: OFFICERS,
      homes: TENANTS,
      street: "Brackenhythe Row",
      home: {
        town: "Harrowgate",
        postcode: "ZX9 8AA",
        estate: "Brackenhythe",
        builtForm: "end-terrace",
        wallType: "filled-cavity",
        glazingType: "modern-double",
        heatingType: "gas-boiler",
      },
      rooms: [
        { name: "Bedroom", kind: "bedroom" },
        { name: "Bathroom", kind: "bathroom" },
      ],
    },
  );

// ---------------------------------------------------------------------------------------------
// The ledger of writes, and the workers

type Kind = "report" | "message" | "reading" | "sensor";
interface Entry {
  kind: Kind;
  key: string;
  sentAt: number;
  answeredAt: number;
  status: number;
  attempts: number;
  acked: boolean;
  /** For readings and sensor readings: where the row must be. */
  where?: { caseId?: number; roomId?: number; sensorId?: number; takenAt: string };
}
const ledger: Entry[] = [];
const stale = { checked: 0, missed: 0, missedKeys: [] as string[] };
const race = { cases: 0, wins: new Map<number, number>(), answers: new Map<string, number>() };

const report = (token: string, roomId: number) => ({
  description: `${token} Mould spreading along the bathroom ceiling.`,
  locations: ["ceiling"],
  observations: ["mould-spots"],
  roomIds: [roomId],
});

/** Reads an acknowledged write back through the other instance (the front when it is down). */
async function readBack(s: Session, servedBy: string | null, url: string, has: (body: unknown) => boolean, key: string) {
  const other = apps.find((a) => a && a.name !== servedBy && a.child.exitCode === null && a.child.signalCode === null);
  const reader = other ? Object.assign(new Session(`http://127.0.0.1:${other.port}`), { cookie: s.cookie, csrf: s.csrf }) : s;
  const a = await once(reader, "GET", url, undefined);
  if (a.status === 0 || a.status >= 500) return; // not an answer: nothing to judge
  stale.checked++;
  if (a.status !== 200 || !has(a.body)) {
    stale.missed++;
    if (stale.missedKeys.length < 5) stale.missedKeys.push(`${key} (${a.status})`);
  }
}

let running = true;
const newCases: { id: number }[] = [];

function tenantWorker(s: Session, t: Seeded["tenants"][number], n: number, ownCase: number) {
  return (async () => {
    let i = 0;
    while (running) {
      i++;
      const kind: Kind = (["report", "message", "reading"] as const)[i % 3]!;
      const key = `FT-${{ report: "C", message: "M", reading: "H", sensor: "S" }[kind]}-${n}-${String(i).padStart(5, "0")}`;
      const entry: Entry = { kind, key, sentAt: performance.now(), answeredAt: 0, status: 0, attempts: 0, acked: false };
      ledger.push(entry);
      let a: Answer;
      if (kind === "report") {
        a = await write(s, "POST", "/api/cases", report(key, t.roomId), key);
        entry.answeredAt = performance.now();
        entry.acked = a.status === 201;
        const id = (a.body as { id?: number } | null)?.id;
        if (entry.acked && id) {
          newCases.push({ id });
          await readBack(s, a.servedBy, `/api/cases/${id}`, (b) => (b as { id?: number }).id === id, key);
        }
      } else if (kind === "message") {
        a = await write(s, "POST", `/api/cases/${ownCase}/messages`, { body: `${key} Any news on the repair?` }, key);
        entry.answeredAt = performance.now();
        entry.acked = a.status === 201;
        if (entry.acked)
          await readBack(s, a.servedBy, `/api/cases/${ownCase}/messages`, (b) => JSON.stringify(b).includes(key), key);
      } else {
        // A fixed calendar far from today: one reading a minute per tenant, unique by (case, room, time).
        const takenAt = new Date(Date.UTC(2025, 0, 1) + (n * 20_000 + i) * 60_000).toISOString();
        entry.where = { caseId: ownCase, roomId: t.roomId, takenAt };
        a = await write(
          s,
          "POST",
          `/api/cases/${ownCase}/readings`,
          [{ roomId: t.roomId, takenAt, airTemperatureC: 17.5, relativeHumidityPct: 74 }],
          key,
        );
        // A retry that finds its own earlier attempt stored is told so (409): that write was acknowledged.
        entry.acked = a.status === 201 || a.status === 200 || (a.status === 409 && a.attempts > 1);
      }
      entry.status = a.status;
      entry.attempts = a.attempts;
      entry.answeredAt ||= performance.now();
      if (!entry.acked && a.status !== 0 && a.status < 500 && a.status !== 409)
        console.warn(`  unexpected ${a.status} for ${key}: ${JSON.stringify(a.body).slice(0, 200)}`);
    }
  })();
}

let sensorRefusalShown = false;
function sensorWorker(base: string, sensorId: number, secret: string, n: number, from: number) {
  const s = sensorSession(base, secret);
  return (async () => {
    let i = 0;
    while (running) {
      i++;
      // Five readings a second apart, at times relative to when this run started (never the calendar).
      const times = Array.from({ length: 5 }, (_, k) =>
        new Date(from + ((i - 1) * 5 + k) * 1000).toISOString().replace(/\.\d{3}Z$/, "Z"),
      );
      const key = `FT-S-${n}-${String(i).padStart(5, "0")}`;
      const entries = times.map((takenAt): Entry => ({
        kind: "sensor",
        key: `${key}-${takenAt}`,
        sentAt: performance.now(),
        answeredAt: 0,
        status: 0,
        attempts: 0,
        acked: false,
        where: { sensorId, takenAt },
      }));
      ledger.push(...entries);
      const a = await write(
        s,
        "POST",
        "/api/sensor-ingest/readings",
        { readings: times.map((takenAt) => ({ takenAt, airTemperatureC: 18.2, relativeHumidityPct: 71 })) },
        key,
      );
      const refused = (a.body as { refused?: { index: number; reason: string }[] } | null)?.refused ?? [];
      if (refused.length > 0 && !sensorRefusalShown) {
        sensorRefusalShown = true;
        console.warn(`  sensor readings refused: ${refused[0]!.reason}`);
      }
      for (const [k, e] of entries.entries()) {
        e.status = a.status;
        e.attempts = a.attempts;
        e.answeredAt = performance.now();
        e.acked = a.status === 200 && !refused.some((r) => r.index === k);
      }
      await sleep(50);
    }
  })();
}

/** Fetch with the sensor's key (Session sends cookies; sensors send a bearer token instead). */
function sensorSession(base: string, secret: string): Session {
  const s = new Session(base);
  Object.defineProperty(s, "headers", { get: () => ({ authorization: `Bearer ${secret}` }) });
  return s;
}

/** Officers racing: RACERS concurrent moves of the same new case to triaged; exactly one may win. */
function raceWorker(officers: Session[]) {
  return (async () => {
    while (running) {
      const c = newCases.shift();
      if (!c) {
        await sleep(100);
        continue;
      }
      race.cases++;
      const answers = await Promise.all(
        Array.from({ length: RACERS }, (_, r) =>
          write(
            officers[r % officers.length]!,
            "PATCH",
            `/api/cases/${c.id}`,
            { status: "triaged", reason: `Fault test race ${r}` },
            `FT-RACE-${c.id}-${r}`,
          ),
        ),
      );
      race.wins.set(c.id, answers.filter((a) => a.status === 200).length);
      for (const a of answers) race.answers.set(String(a.status), (race.answers.get(String(a.status)) ?? 0) + 1);
      await sleep(100);
    }
  })();
}

function errorRate(from: number, to: number) {
  const window = samples.filter((s) => s.at >= from && s.at <= to);
  const failed = window.filter((s) => s.failed).length;
  return { requests: window.length, failed, "error %": (100 * failed) / Math.max(1, window.length) };
}

/** Seconds from `from` until the first write sent after it was acknowledged. */
async function firstAckAfter(from: number, timeoutMs = 60_000): Promise<number | null> {
  const deadline = performance.now() + timeoutMs;
  while (performance.now() < deadline) {
    const first = ledger.filter((e) => e.sentAt >= from && e.acked).sort((a, b) => a.answeredAt - b.answeredAt)[0];
    if (first) return (first.answeredAt - from) / 1000;
    await sleep(50);
  }
  return null;
}

// ---------------------------------------------------------------------------------------------

let failed = false;
// Ctrl-C: stop what was started (the nodes and HAProxy run in process groups of their own).
for (const signal of ["SIGINT", "SIGTERM"] as const)
  process.on(signal, () => {
    running = false;
    void shutdown().finally(() => process.exit(130));
  });
try {
  console.log(
    `Machine: ${cpus().length} cores, load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(" ")}; work folder ${work}`,
  );
  await ensureSystemPackages([MARIADB, GALERA], step);
  step("Building the server (tsc → dist-server)…");
  await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], { cwd: projectRoot });

  // The cluster, the fronts, the mail catcher ---------------------------------------------------
  const galera = await newCluster("galera");
  let t = performance.now();
  step(`Three Galera nodes on 127.0.0.1:${galera.nodes.map((n) => n.port).join(", ")}…`);
  const boot = await startCluster(galera);
  const bootFigures = boot.timings.map((x) => ({ node: x.node, how: x.how, s: x.ms / 1000 }));
  await ensureAppDatabase({ dir: boot.bootstrapped.dir, port: boot.bootstrapped.port }, db);
  const [dbPort, httpPort, smtpPort, app1Port, app2Port] = [
    await freePort(),
    await freePort(),
    await freePort(),
    await freePort(),
    await freePort(),
  ];
  const appPorts = [app1Port!, app2Port!];
  haproxy = await startHaproxy({
    dir: path.join(work, "haproxy"),
    db: { port: dbPort!, nodes: galera.nodes.map((n) => ({ name: n.name, port: n.port, socket: nodeSocket(n) })) },
    http: { port: httpPort!, apps: appPorts.map((port, i) => ({ name: `app${i + 1}`, port })) },
  });
  while ((await activeDbNode(haproxy)) === null) await sleep(100);
  smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    onData: (s, _x, cb) => s.on("end", cb).resume(),
  });
  // An app instance killed in the middle of a message resets its connection: not an error of ours.
  smtp.on("error", () => undefined);
  await new Promise<void>((resolve) => smtp!.listen(smtpPort, "127.0.0.1", () => resolve()));
  const base = `http://127.0.0.1:${httpPort}`;
  // Photos in the object store, as in start:cluster: every instance sees every object.
  objectStore = await startS3StandIn({ dir: path.join(work, "objects"), port: await freePort(), bucket: "dewline-photos" });
  const appEnv: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "development",
    APP_URL: base,
    DB_HOST: "127.0.0.1",
    DB_PORT: String(dbPort),
    DB_NAME: db.name,
    DB_USER: db.user,
    DB_PASSWORD: db.password,
    SMTP_PORT: String(smtpPort),
    ...objectStore.env,
    UPLOADS_DIR: path.join(work, "uploads"),
    TRUST_PROXY: "loopback",
    DB_SYNC_WAIT: "1",
    LOG_LEVEL: "warn",
    // The load signs in eight users from one address; the failure limit only counts failures.
    SESSION_CACHE_MS: "1000",
  };
  step("Migrating and seeding through the database front…");
  await runStep(process.execPath, ["dist-server/server/migrate.js"], { cwd: projectRoot, env: appEnv, stdio: "ignore" });
  const seeded = await seed(dbPort!);
  pool = mysql.createPool({
    host: "127.0.0.1",
    port: dbPort,
    user: db.user,
    password: db.password,
    database: db.name,
    connectionLimit: 2,
  });
  step(`Two app instances behind ${base}…`);
  for (const [i, port] of appPorts.entries())
    apps[i] = await startAppInstance({ name: `app${i + 1}`, port, env: appEnv, logFile: path.join(work, `app${i + 1}.log`) });
  const setupS = elapsed(t);

  // Sessions, first cases, sensors --------------------------------------------------------------
  const officers: Session[] = [];
  for (const e of seeded.officers) officers.push(await Session.signIn(base, e, PASSWORD));
  const admin = await Session.signIn(base, seeded.admin, PASSWORD);
  const tenants: { s: Session; t: Seeded["tenants"][number]; caseId: number }[] = [];
  for (const [i, tn] of seeded.tenants.entries()) {
    const s = await Session.signIn(base, tn.email, PASSWORD);
    const res = await s.request("POST", "/api/cases", report(`FT-FIRST-${i}`, tn.roomId));
    tenants.push({ s, t: tn, caseId: ((await res.json()) as { id: number }).id });
  }
  const runStart = Date.now();
  const installedOn = new Date(runStart - 30 * 86_400_000).toISOString().slice(0, 10);
  const sensors: { id: number; secret: string }[] = [];
  for (let i = 0; i < 2; i++) {
    const tn = seeded.tenants[i]!;
    const res = await admin.request("POST", "/api/sensors", {
      propertyId: tn.propertyId,
      roomId: tn.roomId,
      serial: `FT-SENSOR-${i + 1}`,
      model: "Fault test logger",
      placement: "Bathroom wall, 1.5 m",
      measuresSurface: false,
      intervalS: 300,
      installedOn,
    });
    if (res.status !== 201) throw new Error(`could not register a sensor: ${res.status} ${await res.text()}`);
    const created = (await res.json()) as { sensor: { id: number }; credentials: { secret: string } };
    sensors.push({ id: created.sensor.id, secret: created.credentials.secret });
  }

  // The load, and the faults under it -------------------------------------------------------------
  step("Mixed load through the HTTP front: tenants, sensors, officers' queue and races…");
  const loadStart = performance.now();
  const workers = [
    ...tenants.map((x, i) => tenantWorker(x.s, x.t, i + 1, x.caseId)),
    // Sensor readings half an hour old and on, a second apart: live enough to be taken, never in the future.
    ...sensors.map((x, i) => sensorWorker(base, x.id, x.secret, i + 1, runStart - 30 * 60_000)),
    raceWorker(officers),
    (async () => {
      while (running) {
        await once(officers[0]!, "GET", "/api/cases?status=open", undefined);
        await sleep(50);
      }
    })(),
  ];
  // Watches the database front: a moment with connections open to two nodes at once would be two writers.
  const writers = { most: 0, seen: new Set<string>() };
  const watcher = (async () => {
    while (running) {
      const open = (await haproxy!.status().catch(() => []))
        .filter((x) => x.proxy === "db" && x.current > 0 && x.status === "UP")
        .map((x) => x.server);
      writers.most = Math.max(writers.most, open.length);
      // A node just killed keeps its count until HAProxy marks it down: only live (UP) nodes are counted.
      if (open.length > 1) writers.seen.add(`${open.join("+")} at ${elapsed(loadStart).toFixed(0)} s`);
      await sleep(200);
    }
  })();
  await sleep(5000);
  const steady = errorRate(loadStart, performance.now());

  const faults: Record<string, string | number>[] = [];
  // 1. The writer node, killed.
  const writerName = await activeDbNode(haproxy);
  const writer = galera.nodes.find((n) => n.name === writerName)!;
  step(`1. SIGKILL of Galera node ${writer.name} (the one taking the writes)…`);
  const writerPid = nodePid(writer)!;
  const killedAt = killNode(writer);
  await waitForExit(writerPid);
  const writesBack = await firstAckAfter(killedAt);
  let failover: string | null = null;
  while ((failover = await activeDbNode(haproxy)) === writer.name) await sleep(100);
  await sleep(2000);
  faults.push({
    fault: `SIGKILL Galera ${writer.name} (writer)`,
    ...errorRate(killedAt, killedAt + (writesBack ?? 0) * 1000 + 1000),
    "writes back in s": writesBack ?? "never",
    after: `writer now ${failover ?? "none"}`,
  });
  // 2. Restarted: recovered position, IST.
  step(`2. Restarting ${writer.name} (--wsrep-recover, then IST)…`);
  t = performance.now();
  // The donor is Desynced while it sends: ask the node that is not taking the writes.
  const rejoined = await rejoinNode(
    galera,
    writer,
    galera.nodes.filter((n) => n !== writer && n.name !== failover).map((n) => n.name),
  );
  const syncedS = elapsed(t);
  const size = (await nodeStatus(writer)).clusterSize;
  faults.push({
    fault: `restart Galera ${writer.name}`,
    ...errorRate(t, performance.now()),
    "writes back in s": "-",
    after: `Synced in ${syncedS.toFixed(1)} s (${rejoined.recovered ? "IST from recovered position" : "as saved"}), cluster size ${size}, writer ${await activeDbNode(haproxy)}`,
  });
  await sleep(2000);
  // 3. An app instance, killed.
  const victim = apps[0]!;
  step(`3. SIGKILL of app instance ${victim.name}…`);
  const appKilledAt = performance.now();
  victim.child.kill("SIGKILL");
  await victim.exited;
  while ((await haproxy.status()).find((x) => x.server === victim.name)?.status.startsWith("UP")) await sleep(50);
  const markedDownS = elapsed(appKilledAt);
  const appWritesBack = await firstAckAfter(appKilledAt);
  await sleep(2000);
  const lastFailure = samples.filter((x) => x.at >= appKilledAt && x.failed).at(-1);
  faults.push({
    fault: `SIGKILL app ${victim.name}`,
    ...errorRate(appKilledAt, appKilledAt + markedDownS * 1000 + 1000),
    "writes back in s": appWritesBack ?? "never",
    after: `front marked it down in ${markedDownS.toFixed(1)} s; last failed request ${lastFailure ? ((lastFailure.at - appKilledAt) / 1000).toFixed(1) : "-"} s after`,
  });
  // 4. Restarted.
  step(`4. Restarting ${victim.name}…`);
  t = performance.now();
  apps[0] = await startAppInstance({
    name: victim.name,
    port: victim.port,
    env: appEnv,
    logFile: path.join(work, `${victim.name}.log`),
  });
  const readyS = elapsed(t);
  while (!(await haproxy.status()).find((x) => x.server === victim.name)?.status.startsWith("UP")) await sleep(50);
  faults.push({
    fault: `restart app ${victim.name}`,
    ...errorRate(t, performance.now()),
    "writes back in s": "-",
    after: `ready in ${readyS.toFixed(1)} s, in the front after ${elapsed(t).toFixed(1)} s`,
  });
  await sleep(3000);
  running = false;
  step("Stopping the load (writes in their retries finish first)…");
  await Promise.all([...workers, watcher]);
  const loadS = elapsed(loadStart);

  // Counting ---------------------------------------------------------------------------------------
  const q = async <T>(sql: string, params: unknown[] = []) => (await pool!.query(sql, params))[0] as T[];
  const rowsPerKey = new Map<string, number>();
  const bump = (k: string) => rowsPerKey.set(k, (rowsPerKey.get(k) ?? 0) + 1);
  for (const r of await q<{ description: string }>("SELECT description FROM cases WHERE description LIKE 'FT-C-%'"))
    bump(r.description.split(" ")[0]!);
  const caseIds = tenants.map((x) => x.caseId);
  for (const r of await q<{ after: string }>(
    "SELECT `after` FROM case_events WHERE type = 'message-from-tenant' AND case_id IN (?)",
    [caseIds],
  ))
    for (const m of r.after.match(/FT-M-\d+-\d{5}/g) ?? []) bump(m);
  for (const r of await q<{ case_id: number; room_id: number; taken_at: Date }>(
    "SELECT case_id, room_id, taken_at FROM readings WHERE case_id IN (?)",
    [caseIds],
  ))
    bump(`reading ${r.case_id}/${r.room_id}/${r.taken_at.toISOString()}`);
  for (const r of await q<{ sensor_id: number; taken_at: Date }>(
    "SELECT sensor_id, taken_at FROM sensor_readings WHERE sensor_id IN (?)",
    [sensors.map((x) => x.id)],
  ))
    bump(`sensor ${r.sensor_id}/${r.taken_at.toISOString()}`);
  const rowKey = (e: Entry) =>
    e.kind === "reading"
      ? `reading ${e.where!.caseId}/${e.where!.roomId}/${new Date(e.where!.takenAt).toISOString()}`
      : e.kind === "sensor"
        ? `sensor ${e.where!.sensorId}/${new Date(e.where!.takenAt).toISOString()}`
        : e.key;
  const writeRows = (["report", "message", "reading", "sensor"] as const).map((kind) => {
    const entries = ledger.filter((e) => e.kind === kind);
    const acked = entries.filter((e) => e.acked);
    const keys = new Set(entries.map(rowKey));
    return {
      writes: kind,
      sent: entries.length,
      acknowledged: acked.length,
      retried: entries.filter((e) => e.attempts > 1).length,
      "not acknowledged": entries.length - acked.length,
      rows: [...keys].reduce((sum, k) => sum + (rowsPerKey.get(k) ?? 0), 0),
      lost: acked.filter((e) => !rowsPerKey.get(rowKey(e))).length,
      duplicated: [...keys].filter((k) => (rowsPerKey.get(k) ?? 0) > 1).length,
      "unacknowledged but stored": entries.filter((e) => !e.acked && rowsPerKey.get(rowKey(e))).length,
    };
  });
  // Races: one winner each, and exactly one status change recorded per case.
  const raced = [...race.wins.keys()];
  const moves = raced.length
    ? await q<{ case_id: number; n: number; status: string }>(
        `SELECT c.id AS case_id, c.status, (SELECT COUNT(*) FROM case_events e WHERE e.case_id = c.id AND e.type = 'status-changed') AS n
           FROM cases c WHERE c.id IN (?)`,
        [raced],
      )
    : [];
  const raceRow = {
    "cases raced": raced.length,
    [`answers (${RACERS} each)`]: [...race.answers.entries()].map(([s, n]) => `${s}×${n}`).join(" "),
    // A move to the status a case already has is answered 200 and changes nothing; a lost update would
    // show as two moves recorded (both racers read "new" and both wrote "triaged").
    "no 2xx answer": raced.filter((id) => race.wins.get(id) === 0).length,
    "lost updates (moves recorded ≠ 1)": moves.filter((m) => Number(m.n) !== 1).length,
    "not triaged": moves.filter((m) => m.status !== "triaged").length,
  };

  // Backup into a fresh cluster ---------------------------------------------------------------------
  step("Stopping the apps, then mariadb-dump --single-transaction through the database front…");
  for (const [i, a] of apps.entries()) {
    if (a) await stopChild(a.child, 20_000);
    apps[i] = undefined;
  }
  const tables = (
    await q<{ t: string }>(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE' ORDER BY table_name",
      [db.name],
    )
  ).map((r) => r.t);
  const countAll = async (p: mysql.Pool) => {
    const counts = new Map<string, number>();
    for (const table of tables)
      counts.set(table, Number(((await p.query(`SELECT COUNT(*) AS n FROM \`${table}\``))[0] as { n: number }[])[0]!.n));
    return counts;
  };
  const noPrimaryKey = await q<{ t: string }>(
    `SELECT t.table_name AS t FROM information_schema.tables t WHERE t.table_schema = ? AND t.table_type = 'BASE TABLE'
       AND NOT EXISTS (SELECT 1 FROM information_schema.table_constraints c WHERE c.table_schema = t.table_schema
                       AND c.table_name = t.table_name AND c.constraint_type = 'PRIMARY KEY')`,
    [db.name],
  );
  const before = await countAll(pool);
  const dumpFile = path.join(work, "dump.sql");
  t = performance.now();
  {
    const child = spawn(
      "mariadb-dump",
      [
        "--no-defaults",
        "-h127.0.0.1",
        `-P${dbPort}`,
        `-u${db.user}`,
        "--single-transaction",
        "--routines",
        "--triggers",
        db.name,
      ],
      { env: { ...process.env, MYSQL_PWD: db.password }, stdio: ["ignore", "pipe", "inherit"] },
    );
    const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
    await pipeline(child.stdout, createWriteStream(dumpFile));
    const code = await exited;
    if (code !== 0) throw new Error(`mariadb-dump failed (exit ${code})`);
  }
  const dumpS = elapsed(t);
  step("A fresh three-node cluster, restored from the dump…");
  await pool.end();
  pool = undefined;
  await haproxy.stop();
  haproxy = undefined;
  await stopCluster(galera);
  t = performance.now();
  const fresh = await newCluster("restored");
  const freshBoot = await startCluster(fresh);
  await ensureAppDatabase({ dir: freshBoot.bootstrapped.dir, port: freshBoot.bootstrapped.port }, db);
  const freshS = elapsed(t);
  t = performance.now();
  await new Promise<void>((resolve, reject) => {
    const child = spawn(
      "mariadb",
      ["--no-defaults", "-h127.0.0.1", `-P${freshBoot.bootstrapped.port}`, `-u${db.user}`, db.name],
      { env: { ...process.env, MYSQL_PWD: db.password }, stdio: ["pipe", "inherit", "inherit"] },
    );
    child.once("exit", (code) => (code === 0 ? resolve() : reject(new Error(`the restore failed (exit ${code})`))));
    pipeline(createReadStream(dumpFile), child.stdin).catch(reject);
  });
  const restoreS = elapsed(t);
  // Counted on another node than the one restored into: the rows must have replicated.
  const other = fresh.nodes.find((n) => n !== freshBoot.bootstrapped)!;
  const otherPool = mysql.createPool({
    host: "127.0.0.1",
    port: other.port,
    user: db.user,
    password: db.password,
    database: db.name,
    connectionLimit: 1,
  });
  const after = await countAll(otherPool);
  await otherPool.end();
  const mismatched = tables.filter((tb) => before.get(tb) !== after.get(tb));

  // Report ----------------------------------------------------------------------------------------
  printTable("Cluster start (s)", bootFigures);
  printTable(`Load before the faults (${RACERS} racers, ${TENANTS} tenants, 2 sensors, 1 queue reader)`, [
    { ...steady, "req/s": steady.requests / 5 },
  ]);
  printTable("Faults under load (error % over the fault's window: from the fault until writes succeed, +1 s)", faults);
  printTable("Acknowledged writes against rows", writeRows);
  console.log(
    `  Database front: at most ${writers.most} node(s) with open connections at once${writers.seen.size ? ` (${[...writers.seen].join(", ")})` : ""}.`,
  );
  printTable("Read-modify-write: officers racing to move the same new case", [raceRow]);
  printTable("Reads after acknowledged writes, through the other instance", [
    { checked: stale.checked, stale: stale.missed, examples: stale.missedKeys.join(", ") || "-" },
  ]);
  printTable("Backup and restore into a fresh cluster", [
    {
      tables: tables.length,
      rows: [...before.values()].reduce((a, b) => a + b, 0),
      "dump s": dumpS,
      "fresh cluster s": freshS,
      "restore s": restoreS,
      "tables whose counts differ": mismatched.length
        ? mismatched.map((tb) => `${tb} ${before.get(tb)}→${after.get(tb)}`).join(", ")
        : "none",
      "tables without a primary key": noPrimaryKey.map((r) => r.t).join(", ") || "none",
    },
  ]);
  const lost = writeRows.reduce((s, r) => s + r.lost, 0);
  const duplicated = writeRows.reduce((s, r) => s + r.duplicated, 0);
  const lostUpdates = raceRow["lost updates (moves recorded ≠ 1)"] + raceRow["not triaged"];
  failed = lost > 0 || duplicated > 0 || lostUpdates > 0 || mismatched.length > 0;
  console.log(
    `\n${failed ? "\x1b[31mFAILED\x1b[0m" : "\x1b[32mOK\x1b[0m"}: ${lost} lost, ${duplicated} duplicated, ${lostUpdates} lost updates, ` +
      `${stale.missed} stale reads of ${stale.checked}, ${mismatched.length} tables differ after restore; ` +
      `load ${loadS.toFixed(0)} s, setup ${setupS.toFixed(0)} s, whole run ${elapsed(started).toFixed(0)} s.`,
  );
} catch (error) {
  failed = true;
  console.error(`\nnpm run test:faults failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
} finally {
  running = false;
  await shutdown();
}
process.exit(failed ? 1 : 0);
