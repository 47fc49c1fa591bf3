// Debian's HAProxy (2.6) as the two fronts of the cluster, both on 127.0.0.1, in one process:
// - the database front (TCP): every connection goes to ONE Galera node at a time. The others are
//   `backup`, and a one-entry stick table keeps the traffic on whichever node took it last, so a node
//   that comes back after a failure does not start taking writes beside the current one (two writers
//   is what lost commits in the Jepsen analysis of March 2026). A node counts as up only while it says
//   Synced (wsrep_local_state 4): an external check asks it over its socket every second; a joining,
//   donor or desynced node is down. Sessions on a node marked down are cut at once, so the app's pool
//   reconnects to the next node instead of waiting on a dead one.
// - the HTTP front: round robin over the app instances, each checked on /api/health/ready (which
//   fails while an instance drains or cannot reach the database). Only connection failures are
//   retried by HAProxy (the request never reached an instance); a request that did reach one is never
//   sent twice — clients retry writes themselves with the same Idempotency-Key.
import { spawn, type ChildProcess } from "node:child_process";
import { chmodSync, closeSync, existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from "node:fs";
import { connect } from "node:net";
import path from "node:path";
import { portAccepts } from "./processes.js";

export interface HaproxyBackend {
  name: string;
  port: number;
  /** The node's Unix socket (database backends): the health check asks it as root. */
  socket?: string;
}

export interface HaproxyOptions {
  dir: string;
  /** The database front (TCP) and its Galera nodes, in order of preference. */
  db?: { port: number; nodes: HaproxyBackend[] };
  /** The HTTP front and the app instances. */
  http?: { port: number; apps: HaproxyBackend[] };
}

export interface Haproxy {
  pid: number;
  /** Asks HAProxy which servers are up and which one the database front uses now. */
  status(): Promise<HaproxyServerStatus[]>;
  stop(): Promise<void>;
}

export interface HaproxyServerStatus {
  proxy: string;
  server: string;
  /** UP, DOWN, MAINT, or "UP 1/2" style transitions. */
  status: string;
  /** Connections open now. */
  current: number;
  /** Connections since start. */
  total: number;
  backup: boolean;
}

const files = (dir: string) => ({
  config: path.join(dir, "haproxy.cfg"),
  check: path.join(dir, "check-synced.sh"),
  admin: path.join(dir, "admin.sock"),
  log: path.join(dir, "haproxy.log"),
});

/** The external check: exit 0 only when the node on that port answers and says Synced (4). */
function checkScript(nodes: HaproxyBackend[]): string {
  const cases = nodes.map((n) => `  ${n.port}) socket='${n.socket}' ;;`).join("\n");
  return [
    "#!/bin/sh",
    "# Written by scripts/lib/haproxy.ts. HAProxy passes: proxy address, proxy port, server address, server port.",
    'case "$4" in',
    cases,
    "  *) exit 1 ;;",
    "esac",
    'state=$(mariadb --no-defaults --socket="$socket" -uroot --connect-timeout=1 --batch --skip-column-names \\',
    "  -e \"SELECT VARIABLE_VALUE FROM information_schema.GLOBAL_STATUS WHERE VARIABLE_NAME = 'WSREP_LOCAL_STATE'\" 2>/dev/null)",
    '[ "$state" = "4" ]',
    "",
  ].join("\n");
}

function config(options: HaproxyOptions): string {
  const f = files(options.dir);
  const lines = [
    "# Written by scripts/lib/haproxy.ts on every start; edits are lost.",
    "global",
    "  maxconn 2000",
    `  stats socket ${f.admin} mode 600 level admin`,
    // The database check runs a script (the mariadb client); HAProxy forks only when told it may.
    "  external-check",
    "  insecure-fork-wanted",
    "  log stderr format short local0 notice",
    "",
    "defaults",
    "  log global",
    "  timeout connect 2s",
    "  retries 2",
    "  option redispatch",
    "",
  ];
  if (options.db) {
    lines.push(
      "listen db",
      `  bind 127.0.0.1:${options.db.port}`,
      "  mode tcp",
      // Pooled connections sit idle for long stretches; the app's own timeouts bound real waits.
      "  timeout client 8h",
      "  timeout server 8h",
      "  option external-check",
      '  external-check path "/usr/bin:/bin"',
      `  external-check command ${f.check}`,
      // One entry for the whole front: every connection sticks to the node the last one went to.
      "  stick-table type integer size 1",
      "  stick on int(1)",
      // A check may take a while on a busy machine: three failures in a row (about 3 s) take a node out.
      "  timeout check 3s",
      "  default-server inter 1s fall 3 rise 2 on-marked-down shutdown-sessions",
      ...options.db.nodes.map((n, i) => `  server ${n.name} 127.0.0.1:${n.port} check${i === 0 ? "" : " backup"}`),
      "",
    );
  }
  if (options.http) {
    lines.push(
      "listen app",
      `  bind 127.0.0.1:${options.http.port}`,
      "  mode http",
      "  balance roundrobin",
      "  option forwardfor",
      // Which instance answered (the fault test reads a write back through the other one).
      "  http-response set-header X-Served-By %s",
      "  option httpchk GET /api/health/ready",
      "  http-check expect status 200",
      "  timeout client 120s",
      // Imports and exports may take a while; the app bounds its own work.
      "  timeout server 300s",
      "  timeout http-keep-alive 10s",
      "  timeout check 3s",
      "  default-server inter 1s fall 3 rise 2",
      ...options.http.apps.map((a) => `  server ${a.name} 127.0.0.1:${a.port} check`),
      "",
    );
  }
  return lines.join("\n");
}

/** Sends one command to HAProxy's admin socket and returns its answer. */
function admin(socketPath: string, command: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(socketPath, () => socket.end(`${command}\n`));
    let out = "";
    socket.on("data", (chunk: Buffer) => (out += chunk.toString()));
    socket.once("end", () => resolve(out));
    socket.once("error", reject);
  });
}

/** Writes the configuration and starts HAProxy in the foreground (its own process group), waiting until its fronts listen. */
export async function startHaproxy(options: HaproxyOptions, timeoutMs = 15_000): Promise<Haproxy> {
  const f = files(options.dir);
  mkdirSync(options.dir, { recursive: true });
  for (const port of [options.db?.port, options.http?.port].filter((p): p is number => p !== undefined)) {
    if (await portAccepts(port)) throw new Error(`Port ${port} on 127.0.0.1 is already in use by another program.`);
  }
  if (options.db) {
    writeFileSync(f.check, checkScript(options.db.nodes));
    chmodSync(f.check, 0o755);
  }
  writeFileSync(f.config, config(options));
  const logFd = openSync(f.log, "a");
  const child: ChildProcess = spawn("haproxy", ["-db", "-f", f.config], { detached: true, stdio: ["ignore", logFd, logFd] });
  closeSync(logFd);
  let exited: string | null = null;
  child.once("exit", (code, signal) => (exited = signal ?? `exit ${code}`));
  child.unref();
  const deadline = Date.now() + timeoutMs;
  const ports = [options.db?.port, options.http?.port].filter((p): p is number => p !== undefined);
  for (;;) {
    if (exited !== null || Date.now() > deadline) {
      if (exited === null) child.kill("SIGKILL");
      const tail = existsSync(f.log) ? readFileSync(f.log, "utf8").split("\n").slice(-15).join("\n") : "";
      throw new Error(`HAProxy did not start (${exited ?? "timed out"}). Its log ends:\n${tail}`);
    }
    if ((await Promise.all(ports.map(portAccepts))).every(Boolean) && existsSync(f.admin)) break;
    await new Promise((r) => setTimeout(r, 50));
  }
  return {
    pid: child.pid!,
    async status() {
      const csv = await admin(f.admin, "show stat");
      const [header, ...rows] = csv.split("\n").filter((l) => l.trim() !== "");
      const cols = header!.replace(/^# /, "").split(",");
      const at = (row: string[], name: string) => row[cols.indexOf(name)] ?? "";
      return rows
        .map((r) => r.split(","))
        .filter((r) => !["FRONTEND", "BACKEND"].includes(at(r, "svname")))
        .map((r) => ({
          proxy: at(r, "pxname"),
          server: at(r, "svname"),
          status: at(r, "status"),
          current: Number(at(r, "scur")),
          total: Number(at(r, "stot")),
          backup: at(r, "bck") === "1",
        }));
    },
    async stop() {
      if (exited !== null) return;
      const gone = new Promise<void>((resolve) => child.once("exit", () => resolve()));
      // SIGUSR1 would wait for every pooled connection to close; SIGTERM stops at once.
      child.kill("SIGTERM");
      const timer = setTimeout(() => child.kill("SIGKILL"), 5000);
      await gone;
      clearTimeout(timer);
    },
  };
}

/** The Galera node the database front sends connections to now: the one UP server holding connections, else the first UP one. */
export async function activeDbNode(haproxy: Haproxy): Promise<string | null> {
  const servers = (await haproxy.status()).filter((s) => s.proxy === "db");
  const up = servers.filter((s) => s.status.startsWith("UP"));
  return (up.find((s) => s.current > 0) ?? up[0])?.server ?? null;
}
