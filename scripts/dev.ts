// `npm run dev`: MariaDB and the mail catcher as for `npm start`, then the API server restarting on
// change (node --watch) and Vite's dev server with hot reload, proxying /api to it.
import { spawn, type ChildProcess } from "node:child_process";
import { loadConfig } from "../server/config/env.js";
import { startFakeWeatherAt } from "./lib/fake-weather.js";
import { ensureAppDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { projectDbDir, projectRoot } from "./lib/paths.js";
import { stopChild } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB } from "./lib/system-packages.js";
import { runSeed } from "./seed.js";

const config = loadConfig();
const children: ChildProcess[] = [];
const db = { dir: projectDbDir, port: config.db.port };

await ensureSystemPackages([MARIADB]);
const { started } = await startMariaDb(db);
await ensureAppDatabase(db, config.db);
console.log(await runSeed(config));
const weather = await startFakeWeatherAt(config.weather.url);

const node = (args: string[]) =>
  children.push(spawn(process.execPath, args, { cwd: projectRoot, stdio: "inherit", env: process.env }));
node([
  "node_modules/maildev/bin/maildev",
  "--ip",
  "127.0.0.1",
  "--web-ip",
  "127.0.0.1",
  "-s",
  String(config.smtp.port),
  "-w",
  String(config.smtp.webPort),
  "--silent",
]);
node(["--import", "tsx", "--watch", "server/server.ts"]);
node(["node_modules/vite/bin/vite.js", "--port", "5173"]);
console.log(`Dev client on http://127.0.0.1:5173 (API on ${config.appUrl}, mail on http://127.0.0.1:${config.smtp.webPort})`);

async function stop() {
  await Promise.all([...children.map((c) => stopChild(c)), weather?.close()]);
  if (started) await stopMariaDb(projectDbDir);
  process.exit(0);
}
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
