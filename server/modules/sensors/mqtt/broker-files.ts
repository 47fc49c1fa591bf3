// Keeps mosquitto's password file and ACL in step with the sensor registry. The broker reads both
// only at start and on SIGHUP, so after every change that issues, revokes or removes a sensor's
// credentials the files are rewritten from the `sensors` table (each to a temporary file, then
// renamed over the old one, so the broker never reads half a file) and the broker is told to reload.
// Several app instances may share the broker's folder: each rewrite then runs under the job lease
// "mqtt-broker-files", so they write one at a time and the last rewrite read the registry last (two
// rewrites at once could rename an older reading of the registry over a newer one).
import { open, readFile, rename, rm, type FileHandle } from "node:fs/promises";
import path from "node:path";
import type { DataSource } from "typeorm";
import type { Clock } from "../../../lib/clock.js";
import type { JobLeases } from "../../../lib/job-lease.js";
import type { Logger } from "../../../lib/logger.js";
import { mosquittoPasswordHash } from "../credentials.js";
import type { BrokerCredentials } from "../sensor-events.js";

/** The files of one broker, all in one folder (`.data/mosquitto` for npm start, a temporary folder in tests). */
export function brokerPaths(dir: string) {
  return {
    dir,
    config: path.join(dir, "mosquitto.conf"),
    passwords: path.join(dir, "passwd"),
    acl: path.join(dir, "acl"),
    pid: path.join(dir, "mosquitto.pid"),
    log: path.join(dir, "mosquitto.log"),
    /** The app's own MQTT password, made by the start script; never read by the broker. */
    appPassword: path.join(dir, "app-password"),
  };
}

/** The topic a device publishes its readings to (its user name is "s" and its id). */
export const sensorReadingsTopic = (mqttUsername: string) => `sensors/${mqttUsername}/readings`;
/** Every device's readings topic: what the app may read. */
export const SENSOR_READINGS_FILTER = "sensors/+/readings";

/**
 * The ACL: the app reads every device's readings; each device may write only its own topic. One
 * `pattern` line covers every device: mosquitto 2.0 reloads per-user ACL blocks in time that grows with
 * the square of their number (measured: 5 000 devices 0.7 s, 20 000 5.7 s, 50 000 about 35 s, the broker
 * unresponsive meanwhile), while this file reloads in about 0.5 s at 50 000 devices. `%u` is the signed-in
 * user name, so the rule still names only the device's own topic.
 */
export function brokerAcl(appUsername: string): string {
  return `user ${appUsername}\ntopic read ${SENSOR_READINGS_FILTER}\n\n# every device: its own topic, write only\npattern write sensors/%u/readings\n`;
}

/** Group-readable: the broker drops to the `mosquitto` user, which owns the folder's group (see scripts/lib/mosquitto.ts). */
export const BROKER_FILE_MODE = 0o640;

export interface BrokerFileSettings {
  /** The broker's folder (its password file, ACL and pid file). */
  dir: string;
  /** The app's MQTT user name and password: the app's line is written first in every rewrite. */
  username: string;
  password: string;
}

export interface BrokerRewrite {
  sensors: number;
  ms: number;
  /** False when no broker was running to be told (the files are written all the same). */
  reloaded: boolean;
}

/** The job lease every rewrite of the broker's files runs under. */
export const BROKER_FILES_LEASE = "mqtt-broker-files";

/** Rows read per query while rewriting: keeps memory flat for 50 000 sensors. */
const PAGE = 5000;

let tempCounter = 0;

export class MosquittoBrokerFiles implements BrokerCredentials {
  private current: Promise<void> = Promise.resolve();
  private queued: Promise<void> | null = null;
  private appLine: string | null = null;
  private readonly changeListeners: (() => void)[] = [];
  /** The last rewrite's size and time (the bench and the logs report them). */
  lastRewrite: BrokerRewrite | null = null;
  /** Rewrites done so far. */
  rewrites = 0;

  constructor(
    private readonly dataSource: DataSource,
    private readonly settings: BrokerFileSettings | null,
    private readonly logger: Logger,
    private readonly clock: Clock,
    /** Without leases (a single process: tests, benches) rewrites are serialised in this process only. */
    private readonly leases: JobLeases | null = null,
  ) {}

  /** Told after every change to the registry's credentials (the subscriber forgets the identities it knows). */
  onChange(listener: () => void): void {
    this.changeListeners.push(listener);
  }

  /**
   * Rewrites both files and reloads the broker. Calls made while a rewrite runs are served together by
   * the one rewrite that starts after it (it reads the registry after their commits). Never rejects.
   */
  credentialsChanged(): Promise<void> {
    for (const listener of this.changeListeners) listener();
    if (!this.settings) return Promise.resolve();
    if (this.queued) return this.queued;
    const settings = this.settings;
    const next = this.current.then(async () => {
      this.queued = null;
      try {
        this.lastRewrite = await this.underLease(() => this.rewrite(settings));
        this.rewrites += 1;
        this.logger.info(this.lastRewrite, "mosquitto password file and ACL rewritten");
      } catch (error) {
        this.logger.error({ err: error }, "could not rewrite mosquitto's password file and ACL");
      }
    });
    this.queued = next;
    this.current = next;
    return next;
  }

  /**
   * Runs `work` holding the broker files' lease, waiting while another instance rewrites. A holder
   * that died keeps it at most one lease length, so waiting longer than twice that means the
   * database cannot be asked (and the registry could not be read either).
   */
  private async underLease<T>(work: () => Promise<T>): Promise<T> {
    const leases = this.leases;
    if (!leases) return work();
    const giveUpAt = performance.now() + 2 * leases.leaseMs;
    const lease = await leases.waitFor(BROKER_FILES_LEASE, { stillWanted: () => performance.now() < giveUpAt });
    if (!lease) throw new Error("another instance kept the broker files' lease (or the database did not answer)");
    try {
      const result = await work();
      await lease.release();
      return result;
    } catch (error) {
      await lease.release(error);
      throw error;
    }
  }

  private async rewrite(settings: BrokerFileSettings): Promise<BrokerRewrite> {
    const started = performance.now();
    const files = brokerPaths(settings.dir);
    this.appLine ??= `${settings.username}:${mosquittoPasswordHash(settings.password)}\n`;
    const suffix = `.${process.pid}.${++tempCounter}.tmp`;
    const passwordsTemp = files.passwords + suffix;
    let passwords: FileHandle | null = null;
    let sensors = 0;
    try {
      // The ACL names no device (see brokerAcl); it is written so that a changed app user name is in it too.
      await writeAtomically(files.acl, brokerAcl(settings.username), suffix);
      passwords = await open(passwordsTemp, "w", BROKER_FILE_MODE);
      await passwords.write(this.appLine);
      const today = londonDate(this.clock.now());
      let afterId = 0;
      for (;;) {
        const rows: { id: number; username: string; hash: string }[] = await this.dataSource.query(
          `SELECT id, mqtt_username AS username, mqtt_password_hash AS hash FROM sensors
            WHERE id > ? AND mqtt_password_hash IS NOT NULL AND revoked_at IS NULL
              AND (removed_on IS NULL OR removed_on > ?)
            ORDER BY id LIMIT ${PAGE}`,
          [afterId, today],
        );
        if (rows.length === 0) break;
        let passwordText = "";
        for (const row of rows) passwordText += `${row.username}:${row.hash}\n`;
        await passwords.write(passwordText);
        sensors += rows.length;
        afterId = Number(rows[rows.length - 1]!.id);
        if (rows.length < PAGE) break;
      }
      await passwords.close();
      passwords = null;
      await rename(passwordsTemp, files.passwords);
    } catch (error) {
      await passwords?.close().catch(() => undefined);
      await rm(passwordsTemp, { force: true });
      throw error;
    }
    const reloaded = await this.reloadBroker(files.pid);
    return { sensors, ms: Math.round(performance.now() - started), reloaded };
  }

  /** SIGHUP to the broker named in the pid file, when that process is a running mosquitto. */
  private async reloadBroker(pidFile: string): Promise<boolean> {
    const pid = await brokerPid(pidFile);
    if (pid === null) {
      this.logger.warn({ pidFile }, "no running mosquitto to reload; it will read the new files when it starts");
      return false;
    }
    process.kill(pid, "SIGHUP");
    return true;
  }
}

/** The pid in the file when that process is alive and is a mosquitto; otherwise null. */
export async function brokerPid(pidFile: string): Promise<number | null> {
  const text = await readFile(pidFile, "utf8").catch(() => "");
  const pid = Number.parseInt(text.trim(), 10);
  if (!Number.isInteger(pid) || pid <= 0) return null;
  const cmdline = await readFile(`/proc/${pid}/cmdline`, "utf8").catch(() => "");
  return cmdline.includes("mosquitto") ? pid : null;
}

function londonDate(at: Date): string {
  return new Intl.DateTimeFormat("en-CA", {
    timeZone: "Europe/London",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
  }).format(at);
}

/** Writes `text` to a temporary file beside `file`, then renames it over `file`. */
export async function writeAtomically(
  file: string,
  text: string,
  suffix = `.${process.pid}.${++tempCounter}.tmp`,
): Promise<void> {
  const temp = file + suffix;
  try {
    const handle = await open(temp, "w", BROKER_FILE_MODE);
    try {
      await handle.write(text);
    } finally {
      await handle.close();
    }
    await rename(temp, file);
  } catch (error) {
    await rm(temp, { force: true });
    throw error;
  }
}
