// `npm start`: everything a person needs to try Dewline on this machine — Debian packages, the client
// build, MariaDB and a mail catcher on loopback, migrations, the demo data, then the app itself.
// Ctrl-C stops everything this script started.
import { spawn, type ChildProcess } from "node:child_process";
import type { Server } from "node:http";
import { loadConfig } from "../server/config/env.js";
import { createApp } from "../server/app.js";
import { createAppContext, type AppContext } from "../server/app-context.js";
import { startBackgroundJobs } from "../server/background.js";
import { DEMO_ACCOUNTS } from "../server/db/seeds/demo.js";
import { ensureAppDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { projectDbDir, projectRoot } from "./lib/paths.js";
import { runStep, stopChild } from "./lib/processes.js";
import { ensureSystemPackages, MARIADB } from "./lib/system-packages.js";
import { runSeed } from "./seed.js";

const config = loadConfig();
const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);
let mariaDbStartedHere = false;
let mailCatcher: ChildProcess | undefined;
let server: Server | undefined;
let ctx: AppContext | undefined;
let stopBackgroundJobs: (() => void) | undefined;

async function shutdown(code: number) {
  step("Stopping…");
  stopBackgroundJobs?.();
  server?.close();
  server?.closeAllConnections();
  await ctx?.close().catch(() => undefined);
  if (mailCatcher) await stopChild(mailCatcher);
  if (mariaDbStartedHere) await stopMariaDb(projectDbDir);
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  await ensureSystemPackages([MARIADB], step);

  step("Building the client (vite build)…");
  await runStep(process.execPath, ["node_modules/vite/bin/vite.js", "build", "--logLevel", "warn"], { cwd: projectRoot });

  step(`Starting MariaDB on 127.0.0.1:${config.db.port} (data in .data/mariadb)…`);
  const db = await startMariaDb({ dir: projectDbDir, port: config.db.port });
  mariaDbStartedHere = db.started;
  if (!db.started) step(`MariaDB was already running (pid ${db.pid}); it will be left running.`);
  await ensureAppDatabase({ dir: projectDbDir, port: config.db.port }, config.db);

  step(`Starting the mail catcher (SMTP 127.0.0.1:${config.smtp.port}, inbox on port ${config.smtp.webPort})…`);
  mailCatcher = spawn(
    process.execPath,
    ["node_modules/maildev/bin/maildev", "--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "-s", String(config.smtp.port), "-w", String(config.smtp.webPort), "--silent"],
    { cwd: projectRoot, stdio: ["ignore", "ignore", "inherit"] },
  );
  mailCatcher.once("exit", (code) => {
    if (code !== null && code !== 0) console.warn(`The mail catcher stopped (exit ${code}); is another one already using port ${config.smtp.port}?`);
  });

  step("Migrating and seeding the demo…");
  step(await runSeed(config));

  ctx = await createAppContext(config);
  const app = createApp(ctx);
  stopBackgroundJobs = startBackgroundJobs(ctx);
  await new Promise<void>((resolve, reject) => {
    server = app.listen(config.port, config.host, () => resolve());
    server.once("error", reject);
  });

  const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
  console.log(`
\x1b[1mDewline is running.\x1b[0m

  App:         ${config.appUrl}
  Calculator:  ${config.appUrl}/calculator
  Mail inbox:  http://127.0.0.1:${config.smtp.webPort}   (invitation and password-reset e-mails land here)

  Demo accounts (password: ${config.demoPassword}):
${DEMO_ACCOUNTS.map((a) => `    ${a.email.padEnd(width)}  ${a.role}  ${a.name}`).join("\n")}

Press Ctrl-C to stop everything.`);
} catch (error) {
  console.error(`\nnpm start failed: ${error instanceof Error ? error.message : String(error)}`);
  await shutdown(1);
}
