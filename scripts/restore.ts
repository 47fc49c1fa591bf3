// `npm run restore -- [--check] [--force] <backup folder>`: verifies every checksum first, then
// restores the database and photo store configured by DB_* and UPLOADS_DIR (or STORAGE_DRIVER=s3 and
// its S3_* bucket), and checks the result
// against the backup's manifest. See README.md.
import { loadConfig } from "../server/config/env.js";
import { migrations } from "../server/db/migrations.js";
import { createObjectStore } from "../server/lib/storage.js";
import { describeManifest, restoreBackup, verifyBackup } from "./lib/backup.js";
import { ensureSystemPackages } from "./lib/system-packages.js";

const args = process.argv.slice(2);
const flags = new Set(args.filter((a) => a.startsWith("--")));
const folders = args.filter((a) => !a.startsWith("--"));
if (folders.length !== 1 || [...flags].some((f) => f !== "--force" && f !== "--check")) {
  console.error("usage: npm run restore -- [--check] [--force] <backup folder>");
  console.error("  --check  only verify the backup's checksums; change nothing");
  console.error("  --force  replace a database that already has tables, and photo files of the same name");
  process.exit(2);
}
const dir = folders[0]!;
const config = loadConfig();
const photoStore = config.storage.driver === "s3" ? createObjectStore(config.storage) : undefined;
const photoPlace = config.storage.driver === "s3" ? `bucket ${config.storage.bucket}` : config.uploadsDir;

try {
  if (flags.has("--check")) {
    const manifest = await verifyBackup(dir);
    console.log(`Backup ${dir} is complete: every checksum matches.`);
    for (const line of describeManifest(manifest)) console.log(`  ${line}`);
  } else {
    await ensureSystemPackages([{ commands: ["mariadb-dump", "mariadb"], packages: ["mariadb-client"] }]);
    const summary = await restoreBackup({
      dir,
      db: config.db,
      uploadsDir: config.uploadsDir,
      photoStore,
      force: flags.has("--force"),
    });
    const m = summary.manifest;
    const rows = Object.values(summary.tables).reduce((a, b) => a + b, 0);
    console.log(`Restored ${dir}`);
    for (const line of describeManifest(m)) console.log(`  ${line}`);
    console.log(
      `  Into database ${config.db.name} at ${config.db.host}:${config.db.port}: ${Object.keys(summary.tables).length} tables, ${rows} rows, every count as in the backup.`,
    );
    if (summary.replacedTables) console.log(`  (--force: ${summary.replacedTables} existing tables were dropped first.)`);
    console.log(
      `  Into ${photoPlace}: ${summary.photos.restored} photo files written, ${summary.photos.alreadyPresent} already there; every file matches its checksum.`,
    );
    if (summary.extraPhotoFiles)
      console.log(`  ${summary.extraPhotoFiles} files in the photo store are not in the backup and were left in place.`);
    const known = new Set(migrations.map((mig) => mig.name));
    const unknown = m.database.migrations.filter((name) => !known.has(name));
    if (unknown.length) {
      console.log(
        `  WARNING: the backup's schema is newer than this code (${unknown.join(", ")}): run the matching version of Dewline.`,
      );
    } else if (m.database.migrations.length < migrations.length) {
      console.log(
        `  The backup's schema is ${migrations.length - m.database.migrations.length} migrations behind this code: run npm run db:migrate (npm start does it).`,
      );
    }
  }
} catch (error) {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
} finally {
  await photoStore?.close();
}
