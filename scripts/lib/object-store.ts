// The photo store for the cluster scripts: the local S3 stand-in (scripts/lib/s3-stand-in.ts) and the
// environment that points the app at it. The stand-in and the app's STORAGE_DRIVER=s3 arrive in their
// own change; until this checkout has them, startObjectStore returns null and the app instances share
// the photo folder, which works while they run on one machine.
import { existsSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

export interface ObjectStore {
  /** STORAGE_DRIVER, S3_ENDPOINT, S3_REGION, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

interface S3StandIn {
  endpoint: string;
  accessKeyId: string;
  secretAccessKey: string;
  stop(): Promise<void>;
}
type StartS3StandIn = (options: { dir: string; port: number; bucket: string }) => Promise<S3StandIn>;

export async function startObjectStore(options: { dir: string; port: number; bucket: string }): Promise<ObjectStore | null> {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const file = ["s3-stand-in.ts", "s3-stand-in.js"].map((f) => path.join(here, f)).find((f) => existsSync(f));
  if (!file) return null;
  // Loaded by path so this file compiles before the stand-in exists.
  const specifier = "./s3-stand-in.js";
  const { startS3StandIn } = (await import(specifier)) as { startS3StandIn: StartS3StandIn };
  const store = await startS3StandIn(options);
  return {
    env: {
      STORAGE_DRIVER: "s3",
      S3_ENDPOINT: store.endpoint,
      S3_REGION: "us-east-1",
      S3_BUCKET: options.bucket,
      S3_ACCESS_KEY_ID: store.accessKeyId,
      S3_SECRET_ACCESS_KEY: store.secretAccessKey,
    },
    stop: () => store.stop(),
  };
}
