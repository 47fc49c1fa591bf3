// `npm run readings:archive -- [--keep-months N | --before YYYY-MM] [--to <dir>] [--dry-run]`: each whole
// month of sensor readings before the cut goes to `<dir>/sensor_readings-YYYY-MM.csv.gz` (gzip CSV, header
// then one line a reading), the file is read back and counted, and only then is the month's partition
// dropped. The cut is SENSOR_READINGS_KEEP_MONTHS (default 24) months before the current one unless
// --before names it. `-- --restore <file>` loads such a file back. Idempotent: run it again after any failure.
// Works on the database the configuration points at (DB_* from the environment), which must be running.
import path from "node:path";
import { parseArgs } from "node:util";
import { loadConfig } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { systemClock } from "../server/lib/clock.js";
import { AppError } from "../server/lib/errors.js";
import { monthOf, monthText, parseMonth } from "../server/modules/sensors/reading-months.js";
import { ReadingPartitionService } from "../server/modules/sensors/reading-partitions.service.js";
import { projectRoot } from "./lib/paths.js";

const USAGE =
  "Usage: npm run readings:archive -- [--keep-months N | --before YYYY-MM] [--to <dir>] [--dry-run]\n" +
  "       npm run readings:archive -- --restore <dir>/sensor_readings-YYYY-MM.csv.gz";

export async function readingsArchive(argv: string[]): Promise<number> {
  let values: { "keep-months"?: string; before?: string; to?: string; "dry-run"?: boolean; restore?: string };
  try {
    ({ values } = parseArgs({
      args: argv,
      options: {
        "keep-months": { type: "string" },
        before: { type: "string" },
        to: { type: "string" },
        "dry-run": { type: "boolean" },
        restore: { type: "string" },
      },
    }));
  } catch (error) {
    console.error(`${(error as Error).message}\n${USAGE}`);
    return 2;
  }
  const config = loadConfig();
  const current = monthOf(systemClock.now());
  let before: number | null;
  if (values.before !== undefined && values["keep-months"] !== undefined) before = null;
  else if (values.before !== undefined) before = parseMonth(values.before);
  else {
    const keep = Number(values["keep-months"] ?? config.sensorReadings.keepMonths);
    before = Number.isInteger(keep) && keep >= 1 ? current - keep : null;
  }
  if (before === null) {
    console.error(`Give either --before YYYY-MM or --keep-months N (a whole number, at least 1).\n${USAGE}`);
    return 2;
  }

  const ds = createDataSource(config.db);
  await ds.initialize().catch((error: Error) => {
    throw new Error(
      `Could not reach the database at ${config.db.host}:${config.db.port} (${error.message}). Start it first: \`npm start\` (or \`npm run db:start\`).`,
    );
  });
  try {
    const partitions = new ReadingPartitionService(ds, systemClock);
    if (values.restore !== undefined) {
      const r = await partitions.restore(path.resolve(values.restore));
      console.log(`${r.month}: ${r.rows} readings in the file, ${r.added} added back (the rest were there already).`);
      return 0;
    }
    const dir = path.resolve(values.to ?? path.join(projectRoot, "archive"));
    const dryRun = values["dry-run"] === true;
    const done = await partitions.archiveBefore(before, dir, { dryRun });
    if (done.length === 0) console.log(`Nothing to archive before ${monthText(before)}.`);
    for (const m of done) {
      console.log(
        dryRun
          ? `${m.month}: would archive about ${m.rows} readings to ${m.file} and drop partition ${m.partition}`
          : `${m.month}: ${m.rows} readings archived to ${m.file} (count checked); partition ${m.partition} dropped`,
      );
    }
    return 0;
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    console.error(error.message);
    return error.status === 400 ? 2 : 1;
  } finally {
    await ds.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  process.exitCode = await readingsArchive(process.argv.slice(2));
}
