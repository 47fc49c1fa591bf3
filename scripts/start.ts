// `npm start`: everything a person needs to try Dewline on this machine — Debian packages, the client
// and server builds, MariaDB, a mail catcher and the MQTT broker (mosquitto) on loopback, migrations, the demo data, then the
// compiled server (`node dist-server/server/server.js`, as in production). Ctrl-C stops everything
// this script started; the server drains its requests first.
import { spawn, type ChildProcess } from "node:child_process";
import { mkdirSync, openSync, rmSync } from "node:fs";
import path from "node:path";
import { loadConfig } from "../server/config/env.js";
import { DEMO_ACCOUNTS } from "../server/db/seeds/demo.js";
import { startFakeWeatherAt, type FakeWeather } from "./lib/fake-weather.js";
import { ensureAppDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { startMosquitto, stopMosquitto } from "./lib/mosquitto.js";
import { startMailCatcher } from "./lib/mail-catcher.js";
import { startSmsStandInAt, type SmsStandIn } from "./lib/sms-stand-in.js";
import { projectBrokerDir, projectDbDir, projectRoot } from "./lib/paths.js";
import { runStep, stopChild, waitUntilReady } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB, MOSQUITTO } from "./lib/system-packages.js";
import { runSeed } from "./seed.js";

const config = loadConfig();
const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);
let mariaDbStartedHere = false;
let brokerStartedHere = false;
let mailCatcher: ChildProcess | undefined;
let server: ChildProcess | undefined;
let weather: FakeWeather | null = null;
let texts: SmsStandIn | null = null;
let simulation: ChildProcess | undefined;
let stopping = false;

/**
 * The demo's live sensors (scripts/simulate-sensors.ts): ten homes, a week of readings sent at once so
 * the charts and Alerts have something to show, then an hour replayed at 12× and on at real time.
 */
const DEMO_SIMULATION = ["--homes", "10", "--interval", "5m", "--backfill", "7d", "--lead", "1h", "--speed", "12"];

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  step("Stopping…");
  if (simulation) await stopChild(simulation, 15_000);
  // The server drains for at most SHUTDOWN_DELAY_MS + SHUTDOWN_TIMEOUT_MS; give it that and a little more.
  if (server) await stopChild(server, config.shutdown.delayMs + config.shutdown.timeoutMs + 5000);
  if (mailCatcher) await stopChild(mailCatcher);
  await weather?.close();
  await texts?.close();
  if (brokerStartedHere) await stopMosquitto(projectBrokerDir);
  if (mariaDbStartedHere) await stopMariaDb(projectDbDir);
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  await ensureSystemPackages([MARIADB, MOSQUITTO], step);

  step("Building the server (tsc → dist-server) and the client (vite build)…");
  rmSync(path.join(projectRoot, "dist-server"), { recursive: true, force: true });
  await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], { cwd: projectRoot });
  await runStep(process.execPath, ["node_modules/vite/bin/vite.js", "build", "--logLevel", "warn"], { cwd: projectRoot });

  step(`Starting MariaDB on 127.0.0.1:${config.db.port} (data in .data/mariadb)…`);
  const db = await startMariaDb({ dir: projectDbDir, port: config.db.port });
  mariaDbStartedHere = db.started;
  if (!db.started) step(`MariaDB was already running (pid ${db.pid}); it will be left running.`);
  await ensureAppDatabase({ dir: projectDbDir, port: config.db.port }, config.db);

  step(`Starting the mail catcher (SMTP 127.0.0.1:${config.smtp.port}, inbox on port ${config.smtp.webPort})…`);
  mailCatcher = startMailCatcher(config.smtp);
  mailCatcher.once("exit", (code) => {
    if (code !== null && code !== 0)
      console.warn(`The mail catcher stopped (exit ${code}); is another one already using port ${config.smtp.port}?`);
  });

  // A local stand-in for the hosted forecast API, with deterministic history and forecasts.
  weather = await startFakeWeatherAt(config.weather.url, step);
  if (weather) step(`Started the local weather service on ${weather.url}.`);
  // A local stand-in for the hosted text-message API: the texts it receives are shown on its page.
  texts = await startSmsStandInAt(config.sms, step);
  if (texts) step(`Started the local text-message stand-in on ${texts.url}.`);
  step(`Starting the MQTT broker (mosquitto on 127.0.0.1:${config.mqtt.port}, files in .data/mosquitto)…`);
  const broker = await startMosquitto({ dir: projectBrokerDir, port: config.mqtt.port, appUsername: config.mqtt.username });
  brokerStartedHere = broker.started;
  if (!broker.started) step(`The MQTT broker was already running (pid ${broker.pid}); it will be left running.`);
  // The app's MQTT password is made once for this data folder (never a constant in the repository).
  const serverEnv = {
    ...process.env,
    MQTT_URL: config.mqtt.url,
    MQTT_PASSWORD: broker.app.password,
    MQTT_BROKER_DIR: projectBrokerDir,
  };

  step("Migrating the database (npm run db:migrate)…");
  await runStep(process.execPath, ["dist-server/server/migrate.js"], { cwd: projectRoot });
  step("Seeding the demo…");
  step(await runSeed(config));

  step("Starting the server (node dist-server/server/server.js)…");
  server = spawn(process.execPath, ["dist-server/server/server.js"], { cwd: projectRoot, stdio: "inherit", env: serverEnv });
  const serverExit = new Promise<never>((_resolve, reject) => {
    server?.once("exit", (code, signal) => {
      if (!stopping) reject(new Error(`the server stopped (${signal ?? `exit ${code}`})`));
    });
  });
  serverExit.catch(async (error: Error) => {
    console.error(`\n${error.message}`);
    await shutdown(1);
  });
  const local = config.host === "0.0.0.0" || config.host === "::" ? "127.0.0.1" : config.host;
  await Promise.race([
    waitUntilReady(`http://${local.includes(":") ? `[${local}]` : local}:${config.port}/api/health/ready`),
    serverExit,
  ]);

  const simulationLog = path.join(projectRoot, ".data", "simulate-sensors.log");
  step(`Starting the demo's sensor simulation (10 homes; what it sends is logged in .data/simulate-sensors.log)…`);
  mkdirSync(path.dirname(simulationLog), { recursive: true });
  const simulationOut = openSync(simulationLog, "a");
  simulation = spawn(process.execPath, ["--import", "tsx", "scripts/simulate-sensors.ts", ...DEMO_SIMULATION], {
    cwd: projectRoot,
    stdio: ["ignore", simulationOut, simulationOut],
  });
  simulation.once("exit", (code, signal) => {
    if (!stopping) console.warn(`The sensor simulation stopped (${signal ?? `exit ${code}`}); see .data/simulate-sensors.log.`);
  });

  const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
  console.log(`
\x1b[1mDewline is running.\x1b[0m

  App:         ${config.appUrl}
  Calculator:  ${config.appUrl}/calculator
  Mail inbox:  http://127.0.0.1:${config.smtp.webPort}   (invitation and password-reset e-mails land here)
  Texts:       ${config.sms.baseUrl}   (${texts ? "the local stand-in: texts to tenants are listed on this page" : "as configured"})
  Weather:     ${config.weather.url}   (${weather ? "the local fake: deterministic history and forecasts" : "as configured"})
  MQTT broker: ${config.mqtt.url}   (sensors publish to sensors/<their user name>/readings)

  Demo accounts (password: ${config.demoPassword}):
${DEMO_ACCOUNTS.map((a) => `    ${a.email.padEnd(width)}  ${a.role}  ${a.name}`).join("\n")}

Press Ctrl-C to stop everything.`);
} catch (error) {
  console.error(`\nnpm start failed: ${error instanceof Error ? error.message : String(error)}`);
  await shutdown(1);
}
