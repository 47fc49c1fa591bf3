// `npm run backup [-- --to <folder>]`: the app database (one consistent mariadb-dump) and the photo
// store (UPLOADS_DIR, or the bucket with STORAGE_DRIVER=s3) into a new timestamped folder under
// BACKUP_DIR (default <project>/backups). See README.md.
import { readFileSync } from "node:fs";
import path from "node:path";
import { loadConfig } from "../server/config/env.js";
import { systemClock } from "../server/lib/clock.js";
import { createObjectStore } from "../server/lib/storage.js";
import { createBackup, describeManifest } from "./lib/backup.js";
import { projectRoot } from "./lib/paths.js";
import { ensureSystemPackages } from "./lib/system-packages.js";

const args = process.argv.slice(2);
const toIndex = args.indexOf("--to");
const valid = args.length === 0 || (args.length === 2 && toIndex === 0 && !args[1]!.startsWith("--"));
if (!valid) {
  console.error("usage: npm run backup [-- --to <folder>]");
  process.exit(2);
}

const config = loadConfig();
const pkg = JSON.parse(readFileSync(path.join(projectRoot, "package.json"), "utf8")) as { name: string; version: string };
await ensureSystemPackages([{ commands: ["mariadb-dump", "mariadb"], packages: ["mariadb-client"] }]);
// With the disk driver the folder is read directly (as always); with s3, every object of the bucket is copied.
const photoStore = config.storage.driver === "s3" ? createObjectStore(config.storage) : undefined;
try {
  const { dir, manifest } = await createBackup({
    db: config.db,
    uploadsDir: config.uploadsDir,
    photoStore,
    backupsDir: toIndex === -1 ? config.backupsDir : path.resolve(args[toIndex + 1]!),
    now: () => systemClock.now(),
    app: { name: pkg.name, version: pkg.version },
  });
  console.log(`Backup written to ${dir}`);
  for (const line of describeManifest(manifest)) console.log(`  ${line}`);
  console.log(`Check it any time with: npm run restore -- --check ${dir}`);
} catch (error) {
  console.error(`Backup failed, nothing was kept: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
} finally {
  await photoStore?.close();
}
