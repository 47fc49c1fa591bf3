// A MariaDB Galera cluster of three nodes on 127.0.0.1 (Debian's mariadb-server 10.11 + galera-4),
// each node a folder of its own under one cluster folder: used by `npm run start:cluster` (.data/cluster)
// and `npm run test:faults` (a temporary folder). Probe results and the reasons for the flags are in
// /work/shared/GALERA.md; in short:
// - nodes run as the `mysql` user, because the rsync state transfer (SST) drops to `nobody` when run
//   as root and then cannot write the joiner's data folder;
// - failure detection is tuned down (suspect 1 s, evict 2 s) so writes stall about 2 s, not 6 s,
//   when a node dies;
// - durability follows the Jepsen analysis of Galera (March 2026): every commit is flushed to the log
//   (innodb_flush_log_at_trx_commit=1; the binary log is off, so sync_binlog does not apply), writes go
//   to one node at a time (HAProxy, scripts/lib/haproxy.ts), and the app's reads wait for the node to
//   apply everything committed before them (DB_SYNC_WAIT=1: wsrep_sync_wait per session, set by the
//   scripts that start the instances);
// - after a SIGKILL a node's saved position is unknown (seqno -1): it is recovered with
//   --wsrep-recover and passed back with --wsrep-start-position, so the node rejoins by an
//   incremental transfer (IST) instead of copying everything again.
import { execFile, spawn } from "node:child_process";
import { chownSync, closeSync, existsSync, mkdirSync, openSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import { rootSql, runningPid, stopMariaDb } from "./mariadb.js";
import type { SystemNeed } from "./system-packages.js";

const run = promisify(execFile);

/** galera-4 (the replication library), rsync (state transfer to a joining node), haproxy (the fronts). */
export const GALERA: SystemNeed = {
  commands: ["rsync", "haproxy", "mariadb-dump"],
  packages: ["galera-4", "rsync", "haproxy", "mariadb-client"],
};
export const GALERA_PROVIDER = "/usr/lib/galera/libgalera_smm.so";

export interface GaleraNode {
  /** 1, 2, 3 */
  index: number;
  name: string;
  dir: string;
  /** The SQL port on 127.0.0.1. */
  port: number;
  /** Group communication, incremental transfer (IST) and full transfer (SST) ports. */
  gcommPort: number;
  istPort: number;
  sstPort: number;
}

export interface GaleraCluster {
  name: string;
  dir: string;
  nodes: GaleraNode[];
}

/** Lays out a cluster of `size` nodes in `dir`, their ports counted up from the ports given for node 1. */
export function galeraCluster(
  dir: string,
  ports: { sql: number[]; gcomm: number[]; ist: number[]; sst: number[] },
  name = "dewline",
): GaleraCluster {
  const nodes = ports.sql.map((port, i) => ({
    index: i + 1,
    name: `n${i + 1}`,
    dir: path.join(dir, `n${i + 1}`),
    port,
    gcommPort: ports.gcomm[i]!,
    istPort: ports.ist[i]!,
    sstPort: ports.sst[i]!,
  }));
  return { name, dir, nodes };
}

const nodePaths = (node: GaleraNode) => ({
  data: path.join(node.dir, "data"),
  socket: path.join(node.dir, "mariadbd.sock"),
  pid: path.join(node.dir, "mariadbd.pid"),
  log: path.join(node.dir, "error.log"),
  recoverLog: path.join(node.dir, "recover.log"),
  grastate: path.join(node.dir, "data", "grastate.dat"),
});

export const nodeSocket = (node: GaleraNode) => nodePaths(node).socket;

function mysqlIds(): { uid: number; gid: number } {
  const line = readFileSync("/etc/passwd", "utf8")
    .split("\n")
    .find((l) => l.startsWith("mysql:"));
  if (!line) throw new Error("There is no `mysql` user: install the Debian package mariadb-server.");
  const [, , uid, gid] = line.split(":");
  return { uid: Number(uid), gid: Number(gid) };
}

/** Every folder above the cluster's must be enterable by the mysql user, or a node cannot reach its data. */
function checkReachable(dir: string) {
  for (let d = path.dirname(path.resolve(dir)); ; d = path.dirname(d)) {
    if ((statSync(d).mode & 0o001) === 0) {
      throw new Error(
        `The Galera nodes run as the mysql user, which cannot enter ${d}; allow it (chmod o+x ${d}) or use another folder.`,
      );
    }
    if (path.dirname(d) === d) return;
  }
}

function prepareNode(node: GaleraNode) {
  const p = nodePaths(node);
  const { uid, gid } = mysqlIds();
  mkdirSync(p.data, { recursive: true });
  checkReachable(node.dir);
  chownSync(node.dir, uid, gid);
  chownSync(p.data, uid, gid);
}

function baseArgs(cluster: GaleraCluster, node: GaleraNode): string[] {
  const p = nodePaths(node);
  const peers = cluster.nodes.map((n) => `127.0.0.1:${n.gcommPort}`).join(",");
  const provider = [
    `gmcast.listen_addr=tcp://127.0.0.1:${node.gcommPort}`,
    `ist.recv_addr=127.0.0.1:${node.istPort}`,
    "gcache.size=32M",
    // Keepalive must stay under a third of the suspect timeout, or the node refuses to start.
    "evs.keepalive_period=PT0.3S",
    "evs.inactive_check_period=PT0.3S",
    "evs.suspect_timeout=PT1S",
    "evs.inactive_timeout=PT2S",
    "evs.install_timeout=PT2S",
  ].join(";");
  return [
    "--no-defaults",
    `--datadir=${p.data}`,
    `--socket=${p.socket}`,
    `--pid-file=${p.pid}`,
    `--port=${node.port}`,
    "--bind-address=127.0.0.1",
    "--user=mysql",
    "--skip-name-resolve",
    "--character-set-server=utf8mb4",
    "--collation-server=utf8mb4_unicode_ci",
    "--default-time-zone=+00:00",
    "--local-infile=1",
    // Three nodes share two cores and little memory with everything else on this machine.
    "--innodb-buffer-pool-size=96M",
    "--innodb-log-file-size=48M",
    "--performance-schema=OFF",
    "--max-connections=200",
    `--log-error=${p.log}`,
    "--wsrep-on=ON",
    `--wsrep-provider=${GALERA_PROVIDER}`,
    `--wsrep-cluster-name=${cluster.name}`,
    `--wsrep-cluster-address=gcomm://${peers}`,
    `--wsrep-provider-options=${provider}`,
    `--wsrep-sst-receive-address=127.0.0.1:${node.sstPort}`,
    "--wsrep-node-address=127.0.0.1",
    `--wsrep-node-incoming-address=127.0.0.1:${node.port}`,
    `--wsrep-node-name=${node.name}`,
    "--wsrep-sst-method=rsync",
    "--binlog-format=ROW",
    "--default-storage-engine=InnoDB",
    "--innodb-autoinc-lock-mode=2",
    "--innodb-flush-log-at-trx-commit=1",
    // Galera replicates like a binary log, so MariaDB asks for SUPER to create triggers (the
    // migrations' append-only guards) unless told the app user's triggers are trusted.
    "--log-bin-trust-function-creators=1",
  ];
}

export interface GraState {
  uuid: string;
  seqno: number;
  safeToBootstrap: boolean;
}

/** The node's saved replication state (grastate.dat), or null before its first start. */
export function readGraState(node: GaleraNode): GraState | null {
  const file = nodePaths(node).grastate;
  if (!existsSync(file)) return null;
  const text = readFileSync(file, "utf8");
  const field = (name: string) => new RegExp(`^${name}:\\s*(\\S+)`, "m").exec(text)?.[1] ?? "";
  return {
    uuid: field("uuid"),
    seqno: Number(field("seqno") || "-1"),
    safeToBootstrap: field("safe_to_bootstrap") === "1",
  };
}

function markSafeToBootstrap(node: GaleraNode) {
  const file = nodePaths(node).grastate;
  writeFileSync(file, readFileSync(file, "utf8").replace(/^safe_to_bootstrap:.*$/m, "safe_to_bootstrap: 1"));
}

/** Whether the node has data of its own (it has been part of the cluster before). */
export const hasData = (node: GaleraNode) => existsSync(path.join(nodePaths(node).data, "mysql"));

export const nodePid = (node: GaleraNode) => runningPid(node.dir);

/**
 * After a crash: asks InnoDB where the node's data really ends (mariadbd --wsrep-recover, which starts,
 * reads the log and exits) and returns "uuid:seqno", or null when it cannot tell.
 */
export async function recoverPosition(cluster: GaleraCluster, node: GaleraNode): Promise<{ uuid: string; seqno: number } | null> {
  const p = nodePaths(node);
  rmSync(p.recoverLog, { force: true });
  const args = baseArgs(cluster, node).map((a) => (a.startsWith("--log-error=") ? `--log-error=${p.recoverLog}` : a));
  await run("mariadbd", [...args, "--wsrep-recover"], { timeout: 120_000, maxBuffer: 16 * 1024 * 1024 }).catch(() => undefined);
  const log = existsSync(p.recoverLog) ? readFileSync(p.recoverLog, "utf8") : "";
  const match = /Recovered position:?\s*([0-9a-f-]{36}):(-?\d+)/i.exec(log);
  return match ? { uuid: match[1]!, seqno: Number(match[2]) } : null;
}

export interface StartNodeOptions {
  /** Start a new cluster from this node's data (only ever one node, and only when no other runs). */
  bootstrap?: boolean;
  /** The position recovered after a crash ("uuid:seqno"): the node asks for the writes after it (IST). */
  startPosition?: string;
  /**
   * Nodes to ask for the state transfer, in order (any other when none of them can). A donor is
   * Desynced while it sends, and the database front then takes it out: keep the writer off this list.
   */
  donors?: string[];
  timeoutMs?: number;
}

/**
 * Starts the node's mariadbd (in its own process group, so Ctrl-C on the parent does not reach it) and
 * waits until the node is Synced with the cluster (wsrep_local_state 4), which covers any state transfer.
 */
export async function startNode(cluster: GaleraCluster, node: GaleraNode, options: StartNodeOptions = {}): Promise<number> {
  const p = nodePaths(node);
  const existing = runningPid(node.dir);
  if (existing !== null) throw new Error(`Galera node ${node.name} already runs (pid ${existing}).`);
  rmSync(p.pid, { force: true });
  rmSync(p.socket, { force: true });
  prepareNode(node);
  const args = baseArgs(cluster, node);
  if (options.bootstrap) args.push("--wsrep-new-cluster");
  if (options.startPosition) args.push(`--wsrep-start-position=${options.startPosition}`);
  // The trailing comma lets Galera fall back to any node when the ones named cannot donate.
  if (options.donors?.length) args.push(`--wsrep-sst-donor=${options.donors.join(",")},`);
  const logFd = openSync(p.log, "a");
  const child = spawn("mariadbd", args, { detached: true, stdio: ["ignore", logFd, logFd] });
  closeSync(logFd);
  let exited: string | null = null;
  child.once("exit", (code, signal) => (exited = signal ?? `exit ${code}`));
  child.unref();
  const timeoutMs = options.timeoutMs ?? 120_000;
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline && exited === null) {
    const state = await nodeStatus(node).catch(() => null);
    if (state?.localState === 4 && state.ready) return child.pid!;
    await new Promise((r) => setTimeout(r, 150));
  }
  const tail = existsSync(p.log) ? readFileSync(p.log, "utf8").split("\n").slice(-20).join("\n") : "";
  if (exited === null && child.pid) process.kill(child.pid, "SIGKILL");
  throw new Error(
    `Galera node ${node.name} did not become Synced (${exited ?? `not within ${timeoutMs / 1000} s`}). Its log ends:\n${tail}`,
  );
}

export interface NodeStatus {
  /** 1 joining, 2 donor/desynced, 3 joined, 4 synced. */
  localState: number;
  ready: boolean;
  clusterSize: number;
  primary: boolean;
  /** The last write this node committed (wsrep_last_committed). */
  lastCommitted: number;
}

/** The node's replication status, read as root over its socket. Rejects when the node does not answer. */
export async function nodeStatus(node: GaleraNode): Promise<NodeStatus> {
  const { stdout } = await run(
    "mariadb",
    [
      "--no-defaults",
      `--socket=${nodePaths(node).socket}`,
      "-uroot",
      "--batch",
      "--skip-column-names",
      "--connect-timeout=2",
      "-e",
      "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state','wsrep_ready','wsrep_cluster_size','wsrep_cluster_status','wsrep_last_committed')",
    ],
    { timeout: 5000 },
  );
  const v = new Map(stdout.split("\n").map((l) => l.split("\t") as [string, string]));
  return {
    localState: Number(v.get("wsrep_local_state") ?? 0),
    ready: v.get("wsrep_ready") === "ON",
    clusterSize: Number(v.get("wsrep_cluster_size") ?? 0),
    primary: v.get("wsrep_cluster_status") === "Primary",
    lastCommitted: Number(v.get("wsrep_last_committed") ?? -1),
  };
}

/** Waits until every running node of the cluster sees `size` members and is Synced. */
export async function waitForClusterSize(cluster: GaleraCluster, size: number, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const states = await Promise.all(
      cluster.nodes.filter((n) => runningPid(n.dir) !== null).map((n) => nodeStatus(n).catch(() => null)),
    );
    if (states.length >= size && states.every((s) => s && s.clusterSize === size && s.localState === 4)) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`The Galera cluster did not reach ${size} synced members within ${timeoutMs / 1000} s.`);
}

/** Runs SQL as root on one node (over its socket). */
export const nodeSql = (node: GaleraNode, sql: string) => rootSql({ dir: node.dir, port: node.port }, sql);

/** Stops one node cleanly (SIGTERM, waits). A node stopped last this way is the one to start the next cluster from. */
export const stopNode = (node: GaleraNode, timeoutMs = 60_000) => stopMariaDb(node.dir, timeoutMs);

/** SIGKILLs one node (the fault test); returns the time it was killed (performance.now()). */
export function killNode(node: GaleraNode): number {
  const pid = runningPid(node.dir);
  if (pid === null) throw new Error(`Galera node ${node.name} is not running.`);
  process.kill(pid, "SIGKILL");
  return performance.now();
}

/** Waits until a killed process is gone (its pid no longer answers). */
export async function waitForExit(pid: number, timeoutMs = 10_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      process.kill(pid, 0);
    } catch {
      return;
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

/**
 * Restarts a node that was stopped or killed while the rest of the cluster runs: after a crash its
 * position is recovered first, so it catches up by IST; otherwise it starts as it is.
 */
export async function rejoinNode(
  cluster: GaleraCluster,
  node: GaleraNode,
  donors?: string[],
): Promise<{ pid: number; recovered: string | null }> {
  const state = readGraState(node);
  let position: string | undefined;
  if (hasData(node) && (!state || state.seqno < 0)) {
    const recovered = await recoverPosition(cluster, node);
    if (recovered) position = `${recovered.uuid}:${recovered.seqno}`;
  }
  return { pid: await startNode(cluster, node, { startPosition: position, donors }), recovered: position ?? null };
}

/**
 * Starts the whole cluster (first run, or again after a stop or a crash of every node): bootstraps from
 * the node marked safe_to_bootstrap (the last one stopped cleanly); when none is marked (all were
 * killed), recovers every node's position and bootstraps from the most advanced one. The others join
 * one after another. Returns which node was bootstrapped and how long each step took (ms).
 */
export async function startCluster(
  cluster: GaleraCluster,
  log: (line: string) => void = () => undefined,
): Promise<{ bootstrapped: GaleraNode; timings: { node: string; how: string; ms: number }[] }> {
  const timings: { node: string; how: string; ms: number }[] = [];
  const running = cluster.nodes.filter((n) => runningPid(n.dir) !== null);
  if (running.length > 0) {
    throw new Error(
      `Galera node(s) ${running.map((n) => n.name).join(", ")} already run from ${cluster.dir}; stop them first (or use the running cluster).`,
    );
  }
  const withData = cluster.nodes.filter(hasData);
  let first: GaleraNode;
  const positions = new Map<string, string>();
  if (withData.length === 0) {
    first = cluster.nodes[0]!;
    const p = nodePaths(first);
    prepareNode(first);
    // A fresh data folder for the first node; the others receive theirs by state transfer.
    await run(
      "mariadb-install-db",
      ["--no-defaults", `--datadir=${p.data}`, "--user=mysql", "--auth-root-authentication-method=socket", "--skip-test-db"],
      { maxBuffer: 16 * 1024 * 1024 },
    );
  } else {
    const safe = withData.find((n) => readGraState(n)?.safeToBootstrap);
    if (safe) first = safe;
    else {
      // Every node stopped uncleanly: the one whose data goes furthest starts the cluster.
      log("No node was stopped cleanly last; recovering each node's position…");
      let best: { node: GaleraNode; seqno: number } | null = null;
      for (const node of withData) {
        const state = readGraState(node);
        const recovered =
          state && state.seqno >= 0 ? { uuid: state.uuid, seqno: state.seqno } : await recoverPosition(cluster, node);
        if (!recovered) continue;
        positions.set(node.name, `${recovered.uuid}:${recovered.seqno}`);
        if (!best || recovered.seqno > best.seqno) best = { node, seqno: recovered.seqno };
      }
      if (!best) throw new Error(`No Galera node in ${cluster.dir} could tell where its data ends; see the nodes' recover.log.`);
      first = best.node;
      markSafeToBootstrap(first);
    }
  }
  let t = performance.now();
  log(`Bootstrapping the cluster from ${first.name} (127.0.0.1:${first.port})…`);
  await startNode(cluster, first, { bootstrap: true, startPosition: positions.get(first.name) });
  timings.push({ node: first.name, how: "bootstrap", ms: performance.now() - t });
  for (const node of cluster.nodes) {
    if (node === first) continue;
    t = performance.now();
    const how = hasData(node) ? "rejoin (IST when possible)" : "join (full SST)";
    log(`Starting ${node.name} (127.0.0.1:${node.port}): ${how}…`);
    if (hasData(node)) await rejoinNode(cluster, node);
    else await startNode(cluster, node);
    timings.push({ node: node.name, how, ms: performance.now() - t });
  }
  await waitForClusterSize(cluster, cluster.nodes.length);
  return { bootstrapped: first, timings };
}

/**
 * Stops every running node, one at a time and cleanly, so the last one stopped is marked
 * safe_to_bootstrap and the next start needs no recovery. `last` picks that node (the one taking the writes).
 */
export async function stopCluster(cluster: GaleraCluster, last?: GaleraNode): Promise<void> {
  const order = [...cluster.nodes.filter((n) => n !== last), ...(last ? [last] : [])];
  for (const node of order) if (runningPid(node.dir) !== null) await stopNode(node);
}

/** Removes a cluster folder (the fault test's temporary clusters). Refuses while a node runs. */
export function removeCluster(cluster: GaleraCluster) {
  for (const node of cluster.nodes)
    if (runningPid(node.dir) !== null)
      throw new Error(`Galera node ${node.name} still runs; stop it before removing ${cluster.dir}.`);
  rmSync(cluster.dir, { recursive: true, force: true });
}
