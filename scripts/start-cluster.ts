// `npm run start:cluster`: Dewline as it would run on several machines, all on 127.0.0.1 here —
// three MariaDB Galera nodes (data in .data/cluster/galera), HAProxy with a database front that sends
// every connection to one Synced node at a time (the others stand by) and an HTTP front over two app
// instances, the mail catcher, the MQTT broker, the weather stand-in and (when present) the S3
// stand-in. Migrations and the demo data run once, through the database front. Ctrl-C stops it all in
// order: the apps drain, the fronts close, the nodes stop one by one with the writer last, so the next
// start bootstraps from it without any recovery. `npm start` (one MariaDB, one app) stays the default.
import type { ChildProcess } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";
import { setTimeout as sleep } from "node:timers/promises";
import { loadConfig } from "../server/config/env.js";
import { DEMO_ACCOUNTS } from "../server/db/seeds/demo.js";
import { startAppInstance, stopAppInstance, type AppInstance } from "./lib/app-instances.js";
import { startFakeWeatherAt, type FakeWeather } from "./lib/fake-weather.js";
import {
  GALERA,
  galeraCluster,
  nodePid,
  nodeSql,
  nodeStatus,
  startCluster,
  stopCluster,
  type GaleraCluster,
} from "./lib/galera.js";
import { activeDbNode, startHaproxy, type Haproxy } from "./lib/haproxy.js";
import { startMailCatcher } from "./lib/mail-catcher.js";
import { ensureAppDatabase } from "./lib/mariadb.js";
import { startMosquitto, stopMosquitto } from "./lib/mosquitto.js";
import { startS3StandIn, type S3StandIn } from "./lib/s3-stand-in.js";
import { projectRoot } from "./lib/paths.js";
import { runStep, stopChild, waitUntilReady } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB, MOSQUITTO } from "./lib/system-packages.js";
import { runSeed } from "./seed.js";

const config = loadConfig();
const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);
const APP_INSTANCES = 2;
const clusterDir = path.join(projectRoot, ".data", "cluster");
const brokerDir = path.join(clusterDir, "mosquitto");
// The database front takes DB_PORT (so the migrations, the seed and the apps use the usual setting);
// the nodes take the ports just above it. The HTTP front takes PORT, the app instances the ports above.
const frontDbPort = config.db.port;
const galera: GaleraCluster = galeraCluster(path.join(clusterDir, "galera"), {
  sql: [1, 2, 3].map((i) => frontDbPort + i),
  gcomm: [1, 2, 3].map((i) => frontDbPort + 10 + i),
  ist: [1, 2, 3].map((i) => frontDbPort + 20 + i),
  sst: [1, 2, 3].map((i) => frontDbPort + 30 + i),
});
const appPorts = Array.from({ length: APP_INSTANCES }, (_, i) => config.port + 1 + i);
const S3_PORT = 18900;

let haproxy: Haproxy | undefined;
let mailCatcher: ChildProcess | undefined;
let weather: FakeWeather | null = null;
let objectStore: S3StandIn | null = null;
let brokerStartedHere = false;
let galeraStarted = false;
const apps: AppInstance[] = [];
let stopping = false;

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  step("Stopping…");
  // The apps drain first (readiness fails, HAProxy stops sending them requests, requests finish).
  await Promise.all(apps.map((a) => stopAppInstance(a, config.shutdown.delayMs + config.shutdown.timeoutMs + 5000)));
  // The writer stops last: it is then marked safe to bootstrap the next start from.
  const writer = haproxy ? await activeDbNode(haproxy).catch(() => null) : null;
  await haproxy?.stop();
  if (mailCatcher) await stopChild(mailCatcher);
  await weather?.close();
  await objectStore?.stop();
  if (brokerStartedHere) await stopMosquitto(brokerDir);
  if (galeraStarted || galera.nodes.some((n) => nodePid(n) !== null)) {
    step("Stopping the Galera nodes one by one…");
    await stopCluster(
      galera,
      galera.nodes.find((n) => n.name === writer),
    );
  }
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  await ensureSystemPackages([MARIADB, MOSQUITTO, GALERA], step);

  if (
    !existsSync(path.join(projectRoot, "dist-server/server/server.js")) ||
    !existsSync(path.join(projectRoot, "dist/index.html"))
  ) {
    step("Building the server (tsc → dist-server) and the client (vite build)…");
    await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], {
      cwd: projectRoot,
    });
    await runStep(process.execPath, ["node_modules/vite/bin/vite.js", "build", "--logLevel", "warn"], { cwd: projectRoot });
  }

  if (galera.nodes.some((n) => nodePid(n) !== null)) {
    // Left running by a start:cluster that did not get to stop them: stop them cleanly and start over.
    step("Galera nodes from an earlier run are still up; stopping them first…");
    await stopCluster(galera);
  }
  step(`Starting three Galera nodes on 127.0.0.1:${galera.nodes.map((n) => n.port).join(", ")} (data in .data/cluster/galera)…`);
  galeraStarted = true;
  const started = await startCluster(galera, step);
  step(`Cluster up: ${started.timings.map((t) => `${t.node} ${t.how} ${(t.ms / 1000).toFixed(1)} s`).join("; ")}.`);
  await ensureAppDatabase({ dir: started.bootstrapped.dir, port: started.bootstrapped.port }, config.db);

  step(`Starting HAProxy: database front 127.0.0.1:${frontDbPort}, HTTP front 127.0.0.1:${config.port}…`);
  haproxy = await startHaproxy({
    dir: path.join(clusterDir, "haproxy"),
    db: {
      port: frontDbPort,
      nodes: galera.nodes.map((n) => ({ name: n.name, port: n.port, socket: path.join(n.dir, "mariadbd.sock") })),
    },
    http: { port: config.port, apps: appPorts.map((port, i) => ({ name: `app${i + 1}`, port })) },
  });
  // The front sends connections only once a node has passed two checks.
  while ((await activeDbNode(haproxy)) === null) await sleep(200);

  step(`Starting the mail catcher (SMTP 127.0.0.1:${config.smtp.port}, inbox on port ${config.smtp.webPort})…`);
  mailCatcher = startMailCatcher(config.smtp);
  weather = await startFakeWeatherAt(config.weather.url, step);
  step(`Starting the MQTT broker (mosquitto on 127.0.0.1:${config.mqtt.port}, files in .data/cluster/mosquitto)…`);
  const broker = await startMosquitto({ dir: brokerDir, port: config.mqtt.port, appUsername: config.mqtt.username });
  brokerStartedHere = broker.started;
  objectStore = await startS3StandIn({ dir: path.join(clusterDir, "objects"), port: S3_PORT, bucket: "dewline-photos" });
  step(`Object store (S3 stand-in) on ${objectStore.endpoint}, files in .data/cluster/objects.`);

  step("Migrating the database once, through the database front…");
  await runStep(process.execPath, ["dist-server/server/migrate.js"], { cwd: projectRoot });
  step("Seeding the demo once…");
  step(await runSeed(config));

  const appEnv: NodeJS.ProcessEnv = {
    ...process.env,
    ...objectStore.env,
    // Reads wait until the node has applied every write committed before them (wsrep_sync_wait=1).
    DB_SYNC_WAIT: "1",
    APP_URL: config.appUrl,
    DB_HOST: "127.0.0.1",
    DB_PORT: String(frontDbPort),
    // Behind one proxy on this machine: the client's address is the one HAProxy forwards.
    TRUST_PROXY: "loopback",
    // On SIGTERM an instance keeps answering while its readiness fails, long enough for HAProxy's
    // checks (every 1 s, two failures) to take it out before it stops accepting.
    SHUTDOWN_DELAY_MS: String(Math.max(config.shutdown.delayMs, 2500)),
    MQTT_URL: config.mqtt.url,
    MQTT_PASSWORD: broker.app.password,
    MQTT_BROKER_DIR: brokerDir,
  };
  for (const [i, port] of appPorts.entries()) {
    const name = `app${i + 1}`;
    step(`Starting app instance ${name} on 127.0.0.1:${port}…`);
    const instance = await startAppInstance({ name, port, env: appEnv });
    instance.exited.then(
      (why) => {
        if (!stopping) console.warn(`App instance ${name} stopped (${why}); the HTTP front sends its requests to the others.`);
      },
      () => undefined,
    );
    apps.push(instance);
  }
  await waitUntilReady(`http://127.0.0.1:${config.port}/api/health/ready`);

  const writer = await activeDbNode(haproxy);
  const states = await Promise.all(galera.nodes.map((n) => nodeStatus(n).catch(() => null)));
  const noPrimaryKey = (
    await nodeSql(
      started.bootstrapped,
      `SELECT t.table_name FROM information_schema.tables t
         WHERE t.table_schema = '${config.db.name}' AND t.table_type = 'BASE TABLE'
           AND NOT EXISTS (SELECT 1 FROM information_schema.table_constraints c
                           WHERE c.table_schema = t.table_schema AND c.table_name = t.table_name AND c.constraint_type = 'PRIMARY KEY')`,
    )
  )
    .split("\n")
    .filter(Boolean);
  const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
  console.log(`
\x1b[1mDewline is running as a cluster.\x1b[0m

  App:          ${config.appUrl}   (HTTP front over ${apps.map((a) => `${a.name} :${a.port}`).join(", ")})
  Database:     127.0.0.1:${frontDbPort}   (front; writer now: ${writer ?? "none"}; nodes ${galera.nodes
    .map((n, i) => `${n.name} :${n.port} ${states[i]?.localState === 4 ? "synced" : "not synced"}`)
    .join(", ")}; cluster size ${states[0]?.clusterSize ?? "?"})
  Mail inbox:   http://127.0.0.1:${config.smtp.webPort}
  MQTT broker:  ${config.mqtt.url}
  Tables without a primary key: ${noPrimaryKey.length === 0 ? "none" : noPrimaryKey.join(", ")}

  Demo accounts (password: ${config.demoPassword}):
${DEMO_ACCOUNTS.map((a) => `    ${a.email.padEnd(width)}  ${a.role}  ${a.name}`).join("\n")}

Press Ctrl-C to stop everything.`);
} catch (error) {
  console.error(`\nnpm run start:cluster failed: ${error instanceof Error ? error.message : String(error)}`);
  await shutdown(1);
}
