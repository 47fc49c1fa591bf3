// A private MariaDB instance on 127.0.0.1 with its data directory where we say: used by `npm start`
// (inside the project, .data/mariadb) and by the tests (a throwaway temporary directory).
import { execFile, spawn } from "node:child_process";
import { createReadStream, existsSync, mkdirSync, readFileSync, rmSync, openSync, closeSync } from "node:fs";
import { createServer } from "node:net";
import path from "node:path";
import { promisify } from "node:util";
import mysql from "mysql2/promise";

const run = promisify(execFile);

export interface MariaDbInstance {
  dir: string;
  port: number;
}

export interface AppDatabase {
  name: string;
  user: string;
  password: string;
}

const paths = (dir: string) => ({
  data: path.join(dir, "data"),
  socket: path.join(dir, "mariadbd.sock"),
  pid: path.join(dir, "mariadbd.pid"),
  log: path.join(dir, "error.log"),
});

/** The PID in the instance's pid file when that process is alive and is a mariadbd; otherwise null. */
export function runningPid(dir: string): number | null {
  const { pid: pidFile } = paths(dir);
  if (!existsSync(pidFile)) return null;
  const pid = Number.parseInt(readFileSync(pidFile, "utf8").trim(), 10);
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
  } catch {
    return null;
  }
  try {
    const cmdline = readFileSync(`/proc/${pid}/cmdline`, "utf8");
    if (!cmdline.includes("mariadbd")) return null;
  } catch {
    return null;
  }
  return pid;
}

async function ping(dir: string): Promise<boolean> {
  try {
    await run("mariadb-admin", ["--no-defaults", `--socket=${paths(dir).socket}`, "-uroot", "ping"], {
      timeout: 5000,
    });
    return true;
  } catch {
    return false;
  }
}

function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once("error", () => resolve(false));
    server.listen(port, "127.0.0.1", () => server.close(() => resolve(true)));
  });
}

/** A TCP port on 127.0.0.1 that nothing listens on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      const port = typeof address === "object" && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

/**
 * Creates the data directory on first use, starts mariadbd on 127.0.0.1:port unless this
 * instance already runs, and waits until it answers. Stale pid and socket files are removed.
 */
export async function startMariaDb(instance: MariaDbInstance, timeoutMs = 30_000): Promise<{ pid: number; started: boolean }> {
  const p = paths(instance.dir);
  const existing = runningPid(instance.dir);
  if (existing !== null && (await ping(instance.dir))) return { pid: existing, started: false };
  if (existing === null) {
    rmSync(p.pid, { force: true });
    rmSync(p.socket, { force: true });
  }
  mkdirSync(instance.dir, { recursive: true });
  if (!existsSync(path.join(p.data, "mysql"))) {
    rmSync(p.data, { recursive: true, force: true });
    await run(
      "mariadb-install-db",
      ["--no-defaults", `--datadir=${p.data}`, "--user=root", "--auth-root-authentication-method=socket", "--skip-test-db"],
      { maxBuffer: 16 * 1024 * 1024 },
    );
  }
  if (existing === null) {
    if (!(await portIsFree(instance.port))) {
      throw new Error(`Port ${instance.port} on 127.0.0.1 is already in use by another program; set DB_PORT to a free port.`);
    }
    const logFd = openSync(p.log, "a");
    const child = spawn(
      "mariadbd",
      [
        "--no-defaults",
        `--datadir=${p.data}`,
        `--socket=${p.socket}`,
        `--pid-file=${p.pid}`,
        `--port=${instance.port}`,
        "--bind-address=127.0.0.1",
        "--user=root",
        "--skip-name-resolve",
        "--character-set-server=utf8mb4",
        "--collation-server=utf8mb4_unicode_ci",
        "--default-time-zone=+00:00",
        "--local-infile=1",
        "--innodb-buffer-pool-size=256M",
        `--log-error=${p.log}`,
      ],
      { detached: true, stdio: ["ignore", logFd, logFd] },
    );
    child.unref();
    closeSync(logFd);
  }
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const pid = runningPid(instance.dir);
    if (pid !== null && (await ping(instance.dir))) return { pid, started: true };
    await new Promise((r) => setTimeout(r, 100));
  }
  const tail = existsSync(p.log) ? readFileSync(p.log, "utf8").split("\n").slice(-15).join("\n") : "";
  throw new Error(`MariaDB did not answer within ${timeoutMs / 1000} s. Its log ends:\n${tail}`);
}

/** Runs SQL as the instance's root over its Unix socket (root never connects over TCP). */
export async function rootSql(instance: MariaDbInstance, sql: string): Promise<string> {
  const { stdout } = await run(
    "mariadb",
    ["--no-defaults", `--socket=${paths(instance.dir).socket}`, "-uroot", "--batch", "--skip-column-names", "-e", sql],
    { maxBuffer: 16 * 1024 * 1024 },
  );
  return stdout;
}

const quoteId = (s: string) => "`" + s.replace(/`/g, "``") + "`";
const quoteStr = (s: string) => "'" + s.replace(/\\/g, "\\\\").replace(/'/g, "\\'") + "'";

/** Creates the application database and a user with rights on that database only (idempotent). */
export async function ensureAppDatabase(instance: MariaDbInstance, db: AppDatabase): Promise<void> {
  const user = `${quoteStr(db.user)}@'127.0.0.1'`;
  await rootSql(
    instance,
    [
      `CREATE DATABASE IF NOT EXISTS ${quoteId(db.name)} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      `CREATE USER IF NOT EXISTS ${user} IDENTIFIED BY ${quoteStr(db.password)}`,
      `ALTER USER ${user} IDENTIFIED BY ${quoteStr(db.password)}`,
      `GRANT ALL PRIVILEGES ON ${quoteId(db.name)}.* TO ${user}`,
      "FLUSH PRIVILEGES",
    ].join(";\n"),
  );
}

/** Stops the instance by its own PID and waits until the process is gone. */
export async function stopMariaDb(dir: string, timeoutMs = 30_000): Promise<boolean> {
  const pid = runningPid(dir);
  const p = paths(dir);
  if (pid === null) {
    rmSync(p.pid, { force: true });
    rmSync(p.socket, { force: true });
    return false;
  }
  process.kill(pid, "SIGTERM");
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      process.kill(pid, 0);
    } catch {
      rmSync(p.pid, { force: true });
      return true;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  process.kill(pid, "SIGKILL");
  rmSync(p.pid, { force: true });
  rmSync(p.socket, { force: true });
  return true;
}

/** A connection to the app's database that may `LOAD DATA LOCAL INFILE` from files on this machine (the benchmarks' bulk loads). */
export function loadDataConnection(db: AppDatabase & { host: string; port: number }): Promise<mysql.Connection> {
  return mysql.createConnection({
    host: db.host,
    port: db.port,
    user: db.user,
    password: db.password,
    database: db.name,
    infileStreamFactory: (p: string) => createReadStream(p),
  });
}
