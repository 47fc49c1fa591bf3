// App instances for the cluster scripts (start:cluster, test:faults): each is the compiled server
// (`node dist-server/server/server.js`) on a port of its own, named by INSTANCE_NAME, its output either
// prefixed with its name or written to a log file.
import { spawn, type ChildProcess } from "node:child_process";
import { createWriteStream } from "node:fs";
import { createInterface } from "node:readline";
import { projectRoot } from "./paths.js";
import { stopChild, waitUntilReady } from "./processes.js";

export interface AppInstance {
  name: string;
  port: number;
  child: ChildProcess;
  /** Resolves when the process has exited, with why. */
  exited: Promise<string>;
}

export interface AppInstanceOptions {
  name: string;
  port: number;
  env: NodeJS.ProcessEnv;
  /** A file for its output; without one, its lines are printed prefixed with its name. */
  logFile?: string;
  /** In its own process group: Ctrl-C on the terminal does not reach it (the parent stops it in turn). */
  detached?: boolean;
}

/** Starts one instance and waits until its /api/health/ready answers 200 (or it exits). */
export async function startAppInstance(options: AppInstanceOptions, timeoutMs = 90_000): Promise<AppInstance> {
  const child = spawn(process.execPath, ["dist-server/server/server.js"], {
    cwd: projectRoot,
    env: {
      ...options.env,
      HOST: "127.0.0.1",
      PORT: String(options.port),
      // The lease holder's name, the MQTT client id (dewline-<name>) and a field on every log line.
      INSTANCE_NAME: options.name,
    },
    detached: options.detached ?? false,
    stdio: ["ignore", "pipe", "pipe"],
  });
  if (options.logFile) {
    const log = createWriteStream(options.logFile, { flags: "a" });
    child.stdout!.pipe(log);
    child.stderr!.pipe(log);
  } else {
    const prefix = `\x1b[2m[${options.name}]\x1b[0m `;
    createInterface({ input: child.stdout! }).on("line", (line) => console.log(prefix + line));
    createInterface({ input: child.stderr! }).on("line", (line) => console.error(prefix + line));
  }
  const exited = new Promise<string>((resolve) => {
    child.once("error", (error) => resolve(error.message));
    child.once("exit", (code, signal) => resolve(signal ?? `exit ${code}`));
  });
  const instance = { name: options.name, port: options.port, child, exited };
  await Promise.race([
    waitUntilReady(`http://127.0.0.1:${options.port}/api/health/ready`, timeoutMs),
    exited.then((why) => Promise.reject(new Error(`app instance ${options.name} stopped before it was ready (${why})`))),
  ]);
  return instance;
}

/** Stops an instance the way a deploy would (SIGTERM: it drains, then exits), SIGKILL after `timeoutMs`. */
export const stopAppInstance = (instance: AppInstance, timeoutMs = 20_000) => stopChild(instance.child, timeoutMs);
