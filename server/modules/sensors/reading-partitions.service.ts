// The monthly partitions of `sensor_readings` (see the SensorReadingsByMonth migration): the upkeep that
// adds next months' partitions before readings reach them, and the archive that takes a whole old month
// out to a gzip CSV file and then drops its partition (and can load such a file back).
import { createReadStream, createWriteStream, existsSync } from "node:fs";
import { mkdir, open, rename } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { createGunzip, createGzip } from "node:zlib";
import type { PoolConnection } from "mysql2";
import type { DataSource } from "typeorm";
import { MOULD_HISTORY_DAYS } from "../../../src/lib/domain/sensor-alerts.js";
import { SENSOR_LATE_LIMIT_DAYS } from "../../../src/lib/schemas/sensor-readings.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import {
  monthOf,
  monthOfPartition,
  monthPartitionSql,
  monthStart,
  monthText,
  monthsBetween,
  partitionName,
  type MonthIndex,
} from "./reading-months.js";

/** Months of partitions kept ready beyond the current one (so a missed day or two of upkeep costs nothing). Ours. */
export const PARTITION_MONTHS_AHEAD = 3;
/**
 * A month is archived only once it ended at least this long ago: until then a late reading may still
 * arrive for it (SENSOR_LATE_LIMIT_DAYS), and the room watch still reads it (MOULD_HISTORY_DAYS back from
 * a sensor's newest reading).
 */
export const ARCHIVE_MIN_AGE_DAYS = Math.max(SENSOR_LATE_LIMIT_DAYS, MOULD_HISTORY_DAYS);

/** The archive file's columns: the table's, in its order. */
export const ARCHIVE_COLUMNS = [
  "sensor_id",
  "taken_at",
  "air_temperature_c",
  "relative_humidity_pct",
  "surface_temperature_c",
  "battery_pct",
  "received_at",
] as const;
const HEADER = ARCHIVE_COLUMNS.join(",") + "\n";
/** Each row as one CSV line made by MariaDB itself (no NULL in CONCAT_WS, which would skip the field). */
const LINE_SQL =
  "CONCAT_WS(',', sensor_id, taken_at, air_temperature_c, relative_humidity_pct, IFNULL(surface_temperature_c, ''), " +
  "IFNULL(battery_pct, ''), received_at) AS line";

const DAY_MS = 86_400_000;
const TABLE = "sensor_readings";

export interface ReadingPartition {
  name: string;
  /** The month it holds; null for `pmax`. */
  month: MonthIndex | null;
  /** InnoDB's estimate, not a count. */
  approxRows: number;
}

export interface ArchivedMonth {
  month: string;
  partition: string;
  file: string;
  rows: number;
  /** "planned" on a dry run (rows then InnoDB's estimate). A month archived before is not listed again. */
  outcome: "archived" | "planned";
}

/** Where a month's archive goes: `<dir>/sensor_readings-2024-11.csv.gz`. */
export const archiveFileOf = (dir: string, month: MonthIndex): string => path.join(dir, `${TABLE}-${monthText(month)}.csv.gz`);
/** The table a month's rows wait in between leaving the partitioned table and being written out. */
const holdingTableOf = (month: MonthIndex) => `${TABLE}_out_${partitionName(month)}`;

export class ReadingPartitionService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly logger?: Logger,
  ) {}

  /** The table's partitions in order (empty when it is not partitioned). */
  async partitions(): Promise<ReadingPartition[]> {
    const rows = (await this.dataSource.query(
      `SELECT PARTITION_NAME AS name, TABLE_ROWS AS approxRows FROM information_schema.PARTITIONS
        WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND PARTITION_NAME IS NOT NULL
        ORDER BY PARTITION_ORDINAL_POSITION`,
      [TABLE],
    )) as { name: string; approxRows: string | number | null }[];
    return rows.map((r) => ({ name: r.name, month: monthOfPartition(r.name), approxRows: Number(r.approxRows ?? 0) }));
  }

  /**
   * Makes sure the months from the current one (by the clock) through `monthsAhead` later each have a
   * partition, by splitting `pmax` (REORGANIZE PARTITION moves any rows it holds into the new months).
   * Idempotent; returns the partitions it added. A table that is not partitioned is left as it is.
   */
  async ensureAhead(monthsAhead = PARTITION_MONTHS_AHEAD): Promise<string[]> {
    const parts = await this.partitions();
    if (parts.length === 0 || parts.at(-1)?.name !== "pmax") {
      this.logger?.warn({ table: TABLE }, "sensor_readings has no pmax partition: partition upkeep skipped");
      return [];
    }
    const months = parts.map((p) => p.month).filter((m): m is MonthIndex => m !== null);
    const current = monthOf(this.clock.now());
    const highest = months.length ? Math.max(...months) : current - 1;
    const adding = monthsBetween(highest + 1, current + monthsAhead);
    if (adding.length === 0) return [];
    await this.dataSource.query(
      `ALTER TABLE ${TABLE} REORGANIZE PARTITION pmax INTO (${adding.map(monthPartitionSql).join(", ")}, ` +
        "PARTITION pmax VALUES LESS THAN (MAXVALUE))",
    );
    const names = adding.map(partitionName);
    this.logger?.info({ partitions: names }, "sensor readings partitions added");
    return names;
  }

  /**
   * Makes sure `month` and every month after it up to the lowest partition have partitions of their own,
   * by splitting the lowest partition (which otherwise takes every older row). For a restore, or a seed
   * of old readings; returns the partitions added.
   */
  async ensureFrom(month: MonthIndex): Promise<string[]> {
    const lowest = (await this.partitions())[0];
    if (!lowest) throw new ConflictError("sensor_readings is not partitioned by month.");
    if (lowest.month === null || month >= lowest.month) return [];
    const adding = monthsBetween(month, lowest.month - 1);
    await this.dataSource.query(
      `ALTER TABLE ${TABLE} REORGANIZE PARTITION ${lowest.name} INTO (${adding.map(monthPartitionSql).join(", ")}, ` +
        `${monthPartitionSql(lowest.month)})`,
    );
    return adding.map(partitionName);
  }

  /** Whether a month has ended long enough ago to be archived (ARCHIVE_MIN_AGE_DAYS). */
  archivable(month: MonthIndex): boolean {
    return monthStart(month + 1).getTime() <= this.clock.now().getTime() - ARCHIVE_MIN_AGE_DAYS * DAY_MS;
  }

  /**
   * Archives every month before `before` that still has a partition, oldest first: its rows to
   * `archiveFileOf(dir, month)` (gzip CSV, a header then one line a row), the count read back from the
   * file checked against the rows, and only then the partition dropped. Refuses (changing nothing) when a
   * month before the cut is not archivable yet. Safe to run again after a failure at any point: the
   * rows leave the live table by EXCHANGE PARTITION into a holding table, and stay there until their
   * file is written, synced and checked.
   */
  async archiveBefore(before: MonthIndex, dir: string, { dryRun = false } = {}): Promise<ArchivedMonth[]> {
    if (!this.archivable(before - 1)) {
      throw new ValidationError(
        `Months from ${monthText(before - 1)} on cannot be archived yet: a month is archived only once it ended ` +
          `${ARCHIVE_MIN_AGE_DAYS} days ago (late readings, the room watch's history). The current month never is.`,
      );
    }
    const parts = await this.partitions();
    if (parts.length === 0) throw new ConflictError("sensor_readings is not partitioned by month: nothing can be archived.");
    const held = await this.holdingTables();
    const months = new Set<MonthIndex>([
      ...parts.map((p) => p.month).filter((m): m is MonthIndex => m !== null && m < before),
      ...held.filter((m) => m < before),
    ]);
    const out: ArchivedMonth[] = [];
    for (const month of [...months].sort((a, b) => a - b)) {
      const file = archiveFileOf(dir, month);
      const partition = partitionName(month);
      if (dryRun) {
        const approx = parts.find((p) => p.month === month)?.approxRows ?? 0;
        out.push({ month: monthText(month), partition, file, rows: approx, outcome: "planned" });
        continue;
      }
      out.push(await this.archiveMonth(month, dir, held.includes(month)));
    }
    return out;
  }

  /** Months whose rows wait in a holding table (an archive stopped half way). */
  private async holdingTables(): Promise<MonthIndex[]> {
    const rows = (await this.dataSource.query(
      "SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME LIKE ?",
      [`${TABLE}\\_out\\_p%`],
    )) as { name: string }[];
    return rows.map((r) => monthOfPartition(r.name.slice(`${TABLE}_out_`.length))).filter((m): m is MonthIndex => m !== null);
  }

  private async archiveMonth(month: MonthIndex, dir: string, alreadyHeld: boolean): Promise<ArchivedMonth> {
    const partition = partitionName(month);
    const holding = holdingTableOf(month);
    const file = archiveFileOf(dir, month);
    if (!alreadyHeld) {
      // An empty table of the same shape, then one atomic swap: the month's rows leave the live table
      // whole (nothing can be added to them meanwhile) and nothing is deleted yet.
      await this.dataSource.query(`CREATE TABLE ${holding} LIKE ${TABLE}`);
      await this.dataSource.query(`ALTER TABLE ${holding} REMOVE PARTITIONING`);
      await this.dataSource.query(`ALTER TABLE ${TABLE} EXCHANGE PARTITION ${partition} WITH TABLE ${holding}`);
    }
    const [{ n }] = (await this.dataSource.query(`SELECT COUNT(*) AS n FROM ${holding}`)) as { n: string | number }[];
    const rows = Number(n);
    // A file left by an earlier run is kept only if it holds exactly these rows; otherwise written again.
    if (!existsSync(file) || (await countArchiveRows(file).catch(() => -1)) !== rows) {
      const written = await this.writeArchive(holding, file);
      const readBack = await countArchiveRows(file);
      if (written !== rows || readBack !== rows) {
        throw new ConflictError(
          `The archive of ${monthText(month)} holds ${readBack} rows (${written} written), not ${rows}: ` +
            `nothing was dropped; the rows wait in table ${holding}. Run the archive again.`,
        );
      }
    }
    // Only now: the (emptied) partition, then the holding table with the month's rows.
    const parts = await this.partitions();
    if (parts.some((p) => p.name === partition)) await this.dataSource.query(`ALTER TABLE ${TABLE} DROP PARTITION ${partition}`);
    await this.dataSource.query(`DROP TABLE ${holding}`);
    this.logger?.info({ month: monthText(month), rows, file }, "sensor readings month archived");
    return { month: monthText(month), partition, file, rows, outcome: "archived" };
  }

  /** Streams the table's rows to a gzip CSV file (through a `.partial` name, synced, then renamed). */
  private async writeArchive(table: string, file: string): Promise<number> {
    await mkdir(path.dirname(file), { recursive: true });
    const partial = `${file}.partial`;
    const runner = this.dataSource.createQueryRunner();
    let count = 0;
    try {
      const connection = (await runner.connect()) as PoolConnection;
      const rows = connection
        .query(`SELECT ${LINE_SQL} FROM ${table} ORDER BY sensor_id, taken_at`)
        .stream({ highWaterMark: 2000 });
      // Lines joined a thousand at a time: one write per row would cost more than the gzip.
      async function* text(): AsyncGenerator<string> {
        yield HEADER;
        let batch: string[] = [];
        for await (const row of rows as AsyncIterable<{ line: string }>) {
          batch.push(row.line);
          if (batch.length === 1000) {
            count += batch.length;
            yield batch.join("\n") + "\n";
            batch = [];
          }
        }
        count += batch.length;
        if (batch.length) yield batch.join("\n") + "\n";
      }
      await pipeline(Readable.from(text()), createGzip(), createWriteStream(partial));
    } finally {
      await runner.release();
    }
    await syncFile(partial);
    await rename(partial, file);
    await syncFile(path.dirname(file));
    return count;
  }

  /**
   * Loads an archive file back (rows already present are left as they are), first adding back the
   * monthly partitions below the lowest one for the file's month, so its rows land in their own month.
   * Returns the rows added.
   */
  async restore(file: string): Promise<{ month: string; rows: number; added: number }> {
    const match = /(\d{4})-(\d{2})\.csv\.gz$/.exec(path.basename(file));
    const month = match ? Number(match[1]) * 12 + Number(match[2]) - 1 : null;
    if (month === null) throw new ValidationError(`Not an archive file name (sensor_readings-YYYY-MM.csv.gz): ${file}`);
    const rows = await countArchiveRows(file);
    await this.ensureFrom(month);
    const runner = this.dataSource.createQueryRunner();
    try {
      const db = ((await runner.connect()) as PoolConnection).promise();
      const [result] = (await db.query({
        sql:
          `LOAD DATA LOCAL INFILE 'sensor-readings-archive' IGNORE INTO TABLE ${TABLE} CHARACTER SET utf8mb4 ` +
          "FIELDS TERMINATED BY ',' LINES TERMINATED BY '\\n' IGNORE 1 LINES " +
          "(sensor_id, taken_at, air_temperature_c, relative_humidity_pct, @surface, @battery, received_at) " +
          "SET surface_temperature_c = NULLIF(@surface, ''), battery_pct = NULLIF(@battery, '')",
        infileStreamFactory: () => createReadStream(file).pipe(createGunzip()),
      })) as unknown as [{ affectedRows: number }];
      return { month: monthText(month), rows, added: result.affectedRows };
    } finally {
      await runner.release();
    }
  }
}

/** The rows in an archive file: its lines less the header. */
export async function countArchiveRows(file: string): Promise<number> {
  let newlines = 0;
  for await (const chunk of createReadStream(file).pipe(createGunzip()) as AsyncIterable<Buffer>) {
    for (let i = chunk.indexOf(10); i !== -1; i = chunk.indexOf(10, i + 1)) newlines++;
  }
  return newlines - 1;
}

/** fsync: the file's (or folder's) contents are on disk before anything depends on them. */
async function syncFile(p: string): Promise<void> {
  const handle = await open(p, "r");
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}
