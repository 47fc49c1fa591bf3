import { execFile } from "node:child_process";
import { promisify } from "node:util";

const run = promisify(execFile);

export interface SystemNeed {
  /** Commands on PATH that show the need is met (all of them). */
  commands: string[];
  /** Debian packages that provide it. */
  packages: string[];
}

export const MARIADB: SystemNeed = {
  commands: ["mariadbd", "mariadb-install-db", "mariadb-admin", "mariadb"],
  packages: ["mariadb-server", "mariadb-client"],
};
export const CHROMIUM: SystemNeed = { commands: ["chromium"], packages: ["chromium", "fonts-dejavu-core"] };
/** mosquitto (the MQTT broker for sensor readings) and mosquitto_passwd. */
export const MOSQUITTO: SystemNeed = {
  commands: ["mosquitto", "mosquitto_passwd"],
  packages: ["mosquitto", "mosquitto-clients"],
};
/** pdftotext, pdfinfo: the tests read generated PDFs back with them. */
export const POPPLER: SystemNeed = { commands: ["pdftotext", "pdfinfo"], packages: ["poppler-utils"] };

async function onPath(command: string): Promise<boolean> {
  try {
    await run("sh", ["-c", `command -v ${command}`]);
    return true;
  } catch {
    return false;
  }
}

/** Installs, with apt-get, the Debian packages of every need whose command is missing. */
export async function ensureSystemPackages(needs: SystemNeed[], log: (line: string) => void = console.log): Promise<void> {
  const missing: string[] = [];
  for (const need of needs) {
    for (const command of need.commands) {
      if (!(await onPath(command))) {
        missing.push(...need.packages);
        break;
      }
    }
  }
  if (missing.length === 0) return;
  log(`Installing Debian packages: ${missing.join(" ")} (about a minute)…`);
  const opts = { env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" }, maxBuffer: 256 * 1024 * 1024 };
  await run("apt-get", ["update", "-qq"], opts);
  await run("apt-get", ["install", "-y", "-qq", "--no-install-recommends", ...missing], opts);
}
