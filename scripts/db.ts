// `npm run db:start` / `npm run db:stop`: the project's own MariaDB in .data/mariadb.
import { loadConfig } from "../server/config/env.js";
import { ensureAppDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { ensureSystemPackages, MARIADB } from "./lib/system-packages.js";
import { projectDbDir } from "./lib/paths.js";

const command = process.argv[2];
const config = loadConfig();
const instance = { dir: projectDbDir, port: config.db.port };

if (command === "start") {
  await ensureSystemPackages([MARIADB]);
  const { pid, started } = await startMariaDb(instance);
  await ensureAppDatabase(instance, config.db);
  console.log(
    `MariaDB ${started ? "started" : "already running"} (pid ${pid}) on 127.0.0.1:${instance.port}, data in ${projectDbDir}`,
  );
} else if (command === "stop") {
  const stopped = await stopMariaDb(projectDbDir);
  console.log(stopped ? "MariaDB stopped." : "MariaDB was not running.");
} else {
  console.error("usage: db.ts start|stop");
  process.exit(2);
}
