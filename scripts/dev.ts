// `npm run dev`: MariaDB, the mail catcher and the MQTT broker as for `npm start`, then the API server restarting on
// change (node --watch) and Vite's dev server with hot reload, proxying /api to it.
import { spawn, type ChildProcess } from "node:child_process";
import { loadConfig } from "../server/config/env.js";
import { startFakeWeatherAt } from "./lib/fake-weather.js";
import { startSmsStandInAt } from "./lib/sms-stand-in.js";
import { mailCatcherArgs } from "./lib/mail-catcher.js";
import { ensureAppDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { startMosquitto, stopMosquitto } from "./lib/mosquitto.js";
import { projectBrokerDir, projectDbDir, projectRoot } from "./lib/paths.js";
import { stopChild } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB, MOSQUITTO } from "./lib/system-packages.js";
import { runSeed } from "./seed.js";

const config = loadConfig();
const children: ChildProcess[] = [];
const db = { dir: projectDbDir, port: config.db.port };

await ensureSystemPackages([MARIADB, MOSQUITTO]);
const { started } = await startMariaDb(db);
const broker = await startMosquitto({ dir: projectBrokerDir, port: config.mqtt.port, appUsername: config.mqtt.username });
const serverEnv = {
  ...process.env,
  MQTT_URL: config.mqtt.url,
  MQTT_PASSWORD: broker.app.password,
  MQTT_BROKER_DIR: projectBrokerDir,
};
await ensureAppDatabase(db, config.db);
console.log(await runSeed(config));
const weather = await startFakeWeatherAt(config.weather.url);
const texts = await startSmsStandInAt(config.sms);

const node = (args: string[], env: NodeJS.ProcessEnv = process.env) =>
  children.push(spawn(process.execPath, args, { cwd: projectRoot, stdio: "inherit", env }));
node(mailCatcherArgs(config.smtp));
node(["--import", "tsx", "--watch", "server/server.ts"], serverEnv);
node(["node_modules/vite/bin/vite.js", "--port", "5173"]);
console.log(
  `Dev client on http://127.0.0.1:5173 (API on ${config.appUrl}, mail on http://127.0.0.1:${config.smtp.webPort}, texts on ${config.sms.baseUrl})`,
);

async function stop() {
  await Promise.all([...children.map((c) => stopChild(c)), weather?.close(), texts?.close()]);
  if (broker.started) await stopMosquitto(projectBrokerDir);
  if (started) await stopMariaDb(projectDbDir);
  process.exit(0);
}
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
