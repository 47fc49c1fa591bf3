// A private mosquitto (Debian's, 2.0) on 127.0.0.1 with its files in one folder: used by `npm start`
// and `npm run dev` (.data/mosquitto), the tests (a temporary folder), the simulator and the bench.
// Devices and the app sign in with a user name and password (no anonymous access); the ACL lets each
// device publish only to its own topic (one `pattern` rule; see brokerAcl). The app rewrites the password file and ACL and sends SIGHUP
// (server/modules/sensors/mqtt/broker-files.ts); this file writes the first ones and runs the broker.
import { spawn } from "node:child_process";
import { randomBytes } from "node:crypto";
import { chmodSync, chownSync, closeSync, existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from "node:fs";
import { BROKER_FILE_MODE, brokerAcl, brokerPaths, brokerPid } from "../../server/modules/sensors/mqtt/broker-files.js";
import { mosquittoPasswordHash } from "../../server/modules/sensors/credentials.js";
import { portAccepts } from "./processes.js";

export interface MosquittoOptions {
  dir: string;
  port: number;
  /** The app's MQTT user name (the password is made once per folder and kept in it). */
  appUsername?: string;
}

export interface Mosquitto {
  /** mqtt://127.0.0.1:<port> */
  url: string;
  port: number;
  dir: string;
  pid: number;
  /** False when a broker for this folder was already running (it is left running). */
  started: boolean;
  app: { username: string; password: string };
}

export const APP_MQTT_USERNAME = "dewline-app";

/** The gid of the `mosquitto` group (made by the Debian package), or null. */
function mosquittoGid(): number | null {
  try {
    const line = readFileSync("/etc/group", "utf8")
      .split("\n")
      .find((l) => l.startsWith("mosquitto:"));
    return line ? Number(line.split(":")[2]) : null;
  } catch {
    return null;
  }
}

/**
 * Prepares the folder: started as root, mosquitto drops to the `mosquitto` user before it reads the
 * password file and ACL (and again on every SIGHUP), so the folder belongs to that group with the
 * set-group-id bit, and every file written in it (here, or by the app's rewrites) is group-readable
 * and takes that group. The app's own password stays readable by its owner only.
 */
function prepareFolder(dir: string, appUsername: string): { password: string } {
  const files = brokerPaths(dir);
  mkdirSync(dir, { recursive: true });
  const gid = process.getuid?.() === 0 ? mosquittoGid() : null;
  if (gid !== null) chownSync(dir, 0, gid);
  chmodSync(dir, 0o2750);
  if (!existsSync(files.appPassword)) writeFileSync(files.appPassword, randomBytes(24).toString("base64url"), { mode: 0o600 });
  const password = readFileSync(files.appPassword, "utf8").trim();
  // Until the app rewrites them: the app alone.
  writeFileSync(files.passwords, `${appUsername}:${mosquittoPasswordHash(password)}\n`, { mode: BROKER_FILE_MODE });
  writeFileSync(files.acl, brokerAcl(appUsername), { mode: BROKER_FILE_MODE });
  return { password };
}

function brokerConfig(dir: string, port: number): string {
  const files = brokerPaths(dir);
  return [
    "# Written by scripts/lib/mosquitto.ts on every start; edits are lost.",
    "per_listener_settings false",
    `listener ${port} 127.0.0.1`,
    "allow_anonymous false",
    `password_file ${files.passwords}`,
    `acl_file ${files.acl}`,
    "persistence false",
    // A reading batch is at most 5 000 readings (src/lib/schemas/sensor-readings.ts), well under 2 MB.
    "max_packet_size 2097152",
    // stderr is unbuffered (a log file of its own would be written only at exit); it goes to mosquitto.log.
    "log_dest stderr",
    "log_timestamp_format %Y-%m-%dT%H:%M:%S",
    "",
  ].join("\n");
}

function logTail(dir: string): string {
  const { log } = brokerPaths(dir);
  return existsSync(log) ? readFileSync(log, "utf8").split("\n").slice(-15).join("\n") : "";
}

/**
 * Starts mosquitto for this folder on 127.0.0.1:port unless one already runs for it, and waits until it
 * accepts connections. Its pid goes to the folder's pid file, where the app finds it to send SIGHUP.
 */
export async function startMosquitto(options: MosquittoOptions, timeoutMs = 15_000): Promise<Mosquitto> {
  const { dir, port } = options;
  const appUsername = options.appUsername ?? APP_MQTT_USERNAME;
  const files = brokerPaths(dir);
  const url = `mqtt://127.0.0.1:${port}`;
  const running = await brokerPid(files.pid);
  if (running !== null) {
    const password = readFileSync(files.appPassword, "utf8").trim();
    return { url, port, dir, pid: running, started: false, app: { username: appUsername, password } };
  }
  if (await portAccepts(port)) {
    throw new Error(`Port ${port} on 127.0.0.1 is already in use by another program; set MQTT_PORT to a free port.`);
  }
  const { password } = prepareFolder(dir, appUsername);
  writeFileSync(files.config, brokerConfig(dir, port), { mode: BROKER_FILE_MODE });
  const logFd = openSync(files.log, "a", 0o640);
  // Its own process group: Ctrl-C on npm start reaches the server first, which drains before the broker stops.
  const child = spawn("mosquitto", ["-c", files.config], { detached: true, stdio: ["ignore", logFd, logFd] });
  closeSync(logFd);
  const exited = new Promise<string>((resolve) => {
    child.once("error", (error) => resolve(error.message));
    child.once("exit", (code, signal) => resolve(signal ?? `exit ${code}`));
  });
  child.unref();
  if (child.pid === undefined) throw new Error(`mosquitto could not be started: ${await exited}`);
  writeFileSync(files.pid, `${child.pid}\n`, { mode: 0o644 });
  const deadline = Date.now() + timeoutMs;
  let stopped: string | null = null;
  void exited.then((why) => (stopped = why));
  while (Date.now() < deadline && stopped === null) {
    if (await portAccepts(port))
      return { url, port, dir, pid: child.pid, started: true, app: { username: appUsername, password } };
    await new Promise((r) => setTimeout(r, 50));
  }
  if (stopped === null) process.kill(child.pid, "SIGKILL");
  throw new Error(
    `mosquitto did not accept connections on port ${port} (${stopped ?? `not within ${timeoutMs / 1000} s`}). Its log ends:\n${logTail(dir)}`,
  );
}

/** Stops the folder's broker by its own pid (SIGTERM) and waits until it is gone. */
export async function stopMosquitto(dir: string, timeoutMs = 10_000): Promise<boolean> {
  const pid = await brokerPid(brokerPaths(dir).pid);
  if (pid === null) return false;
  process.kill(pid, "SIGTERM");
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      process.kill(pid, 0);
    } catch {
      return true;
    }
    await new Promise((r) => setTimeout(r, 50));
  }
  process.kill(pid, "SIGKILL");
  return true;
}
