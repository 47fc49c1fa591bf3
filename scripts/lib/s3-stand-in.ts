// A local S3-compatible server standing in for the hosted object store (STORAGE_DRIVER=s3): s3rver,
// run as its own process on 127.0.0.1, its objects kept as files under `dir`. It speaks enough of
// the S3 API for the app (PUT, GET, HEAD, DELETE, ListObjectsV2) but it is a test double, not a
// store to trust: it does not check request signatures (a wrong secret is accepted), only the
// access key's name. See DEVELOPERS.md, "Object storage".
import { spawn } from "node:child_process";
import { closeSync, existsSync, mkdirSync, openSync, readFileSync } from "node:fs";
import path from "node:path";
import { projectRoot } from "./paths.js";
import { stopChild } from "./processes.js";

/** s3rver's built-in credentials: the only access key it knows. */
export const S3_STAND_IN_ACCESS_KEY_ID = "S3RVER";
export const S3_STAND_IN_SECRET_ACCESS_KEY = "S3RVER";

export interface S3StandInOptions {
  /** Its data (one folder per bucket) and log go here; created if needed, kept after stop(). */
  dir: string;
  port: number;
  /** Created at start-up (an existing one is kept with its objects). */
  bucket: string;
}

export interface S3StandIn {
  endpoint: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  pid: number;
  /** The environment that points the app at this stand-in. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

function logTail(log: string): string {
  return existsSync(log) ? readFileSync(log, "utf8").split("\n").slice(-15).join("\n") : "";
}

/** Starts s3rver on 127.0.0.1:port with `bucket` and waits until the bucket answers. */
export async function startS3StandIn(options: S3StandInOptions, timeoutMs = 15_000): Promise<S3StandIn> {
  const { dir, port, bucket } = options;
  const dataDir = path.join(dir, "data");
  const log = path.join(dir, "s3rver.log");
  mkdirSync(dataDir, { recursive: true });
  const endpoint = `http://127.0.0.1:${port}`;
  // Our own probe first: s3rver would otherwise fail on a taken port only in its log.
  if (await answers(`${endpoint}/`)) {
    throw new Error(`Port ${port} on 127.0.0.1 already answers HTTP; choose a free port for the S3 stand-in.`);
  }
  const logFd = openSync(log, "a", 0o640);
  // The binary itself, not through npx, so the pid we hold is the server's.
  const child = spawn(
    path.join(projectRoot, "node_modules", ".bin", "s3rver"),
    ["-d", dataDir, "-a", "127.0.0.1", "-p", String(port), "--silent", "--configure-bucket", bucket],
    { stdio: ["ignore", logFd, logFd] },
  );
  closeSync(logFd);
  let stopped: string | null = null;
  child.once("error", (error) => (stopped = error.message));
  child.once("exit", (code, signal) => (stopped = signal ?? `exit ${code}`));

  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline && stopped === null) {
    // HEAD on the bucket: 200 once the server listens and the bucket exists.
    if (await answers(`${endpoint}/${bucket}`, "HEAD")) {
      return {
        endpoint,
        bucket,
        accessKeyId: S3_STAND_IN_ACCESS_KEY_ID,
        secretAccessKey: S3_STAND_IN_SECRET_ACCESS_KEY,
        pid: child.pid!,
        env: {
          STORAGE_DRIVER: "s3",
          S3_ENDPOINT: endpoint,
          S3_BUCKET: bucket,
          S3_ACCESS_KEY_ID: S3_STAND_IN_ACCESS_KEY_ID,
          S3_SECRET_ACCESS_KEY: S3_STAND_IN_SECRET_ACCESS_KEY,
          S3_FORCE_PATH_STYLE: "true",
        },
        stop: () => stopChild(child),
      };
    }
    await new Promise((r) => setTimeout(r, 50));
  }
  await stopChild(child);
  throw new Error(
    `The S3 stand-in (s3rver) did not answer on ${endpoint} (${stopped ?? `not within ${timeoutMs / 1000} s`}). Its log ends:\n${logTail(log)}`,
  );
}

async function answers(url: string, method = "GET"): Promise<boolean> {
  try {
    const res = await fetch(url, { method, signal: AbortSignal.timeout(1000) });
    await res.body?.cancel();
    return method === "HEAD" ? res.ok : true;
  } catch {
    return false;
  }
}
