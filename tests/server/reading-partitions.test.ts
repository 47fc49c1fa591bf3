// The monthly partitions of sensor_readings against real MariaDB: the upkeep adding next months, the
// archive of whole old months to gzip CSV files (and back), and the migration that partitions a table
// already holding readings. Partition DDL locks the whole table, so this file works on a database of its
// own in the run's MariaDB, never on the one the other test files share. Months come from the test clock.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { gunzipSync } from "node:zlib";
import type { DataSource } from "typeorm";
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from "vitest";
import { ensureAppDatabase } from "../../scripts/lib/mariadb.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { SensorReadingsByMonth1796462200000 } from "../../server/db/migrations/1796462200000-SensorReadingsByMonth.js";
import { ValidationError } from "../../server/lib/errors.js";
import { monthOf, monthStart, monthText, partitionName, type MonthIndex } from "../../server/modules/sensors/reading-months.js";
import { archiveFileOf, ReadingPartitionService } from "../../server/modules/sensors/reading-partitions.service.js";
import { testClock } from "../support/test-clock.js";

const testDb = inject("testDb");
const db = { name: "dewline_partitions", user: "dewline_partitions", password: "partitions-only" };
let ds: DataSource;
let dir: string;
const current = monthOf(testClock.now());
const partitions = () => new ReadingPartitionService(ds, testClock);

beforeAll(async () => {
  await ensureAppDatabase({ dir: testDb.dir, port: testDb.port }, db);
  ds = createDataSource({ host: testDb.host, port: testDb.port, ...db });
  await ds.initialize();
  await ds.runMigrations({ transaction: "each" });
  dir = mkdtempSync(path.join(tmpdir(), "dewline-parts-archive-"));
});

afterAll(async () => {
  if (ds?.isInitialized) {
    await ds.query(`DROP DATABASE \`${db.name}\``);
    await ds.destroy();
  }
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** Starts each test from a known layout: months `from`..`through` (relative to now) and pmax, no rows. */
async function layout(from: number, through: number): Promise<void> {
  await ds.query("DROP TABLE IF EXISTS sensor_readings_out_" + partitionName(current - 5));
  await ds.query("TRUNCATE TABLE sensor_readings");
  const parts = [];
  for (let m = current + from; m <= current + through; m++)
    parts.push(`PARTITION ${partitionName(m)} VALUES LESS THAN ('${monthText(m + 1)}-01 00:00:00')`);
  await ds.query(
    `ALTER TABLE sensor_readings PARTITION BY RANGE COLUMNS(taken_at) (${parts.join(", ")}, PARTITION pmax VALUES LESS THAN (MAXVALUE))`,
  );
}

const names = async () => (await partitions().partitions()).map((p) => p.name);

/** Readings of sensor 7 and 8 (no sensor rows needed: the table has no foreign keys), at these instants. */
async function addReadings(times: Date[]): Promise<void> {
  const values = times.flatMap((at, i) => [
    7 + (i % 2),
    at,
    20.5,
    61.25,
    i % 3 === 0 ? null : 14.75,
    i % 4 === 0 ? null : 88,
    at,
  ]);
  await ds.query(
    `INSERT INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at)
     VALUES ${times.map(() => "(?, ?, ?, ?, ?, ?, ?)").join(", ")}`,
    values,
  );
}

/** Instants spread through a month, its first and last second included. */
function timesIn(month: MonthIndex, count: number): Date[] {
  const start = monthStart(month).getTime();
  const end = monthStart(month + 1).getTime() - 1000;
  return Array.from({ length: count }, (_, i) => new Date(start + Math.floor(((end - start) * i) / (count - 1) / 1000) * 1000));
}

const countIn = async (partition: string) =>
  Number((await ds.query(`SELECT COUNT(*) AS n FROM sensor_readings PARTITION (${partition})`))[0].n);
const countAll = async () => Number((await ds.query("SELECT COUNT(*) AS n FROM sensor_readings"))[0].n);

describe("partition upkeep", () => {
  beforeEach(() => layout(-2, 0));

  it("adds the next months' partitions ahead of the clock, once, and moves readings pmax held into them", async () => {
    // A reading two months ahead (a device with a wrong clock, within no month yet): it sits in pmax.
    const ahead = new Date(monthStart(current + 2).getTime() + 3_600_000);
    await addReadings([ahead]);
    expect(await countIn("pmax")).toBe(1);

    const added = await partitions().ensureAhead(3);
    expect(added).toEqual([1, 2, 3].map((k) => partitionName(current + k)));
    expect(await names()).toEqual([...[-2, -1, 0, 1, 2, 3].map((k) => partitionName(current + k)), "pmax"]);
    expect(await countIn(partitionName(current + 2))).toBe(1);
    expect(await countIn("pmax")).toBe(0);

    expect(await partitions().ensureAhead(3)).toEqual([]);
    expect(await names()).toHaveLength(7);
  });

  it("catches up on every month it missed (the app was stopped for a while)", async () => {
    await layout(-6, -4);
    expect(await partitions().ensureAhead(1)).toEqual([-3, -2, -1, 0, 1].map((k) => partitionName(current + k)));
  });
});

describe("archive of old months", () => {
  beforeEach(() => layout(-5, 1));

  it("writes each old month to its own gzip CSV, checks the count, drops its partition, and leaves later months as they were", async () => {
    await addReadings([
      ...timesIn(current - 5, 40),
      ...timesIn(current - 4, 30),
      ...timesIn(current - 3, 20),
      ...timesIn(current, 10),
    ]);
    const later = await ds.query("SELECT * FROM sensor_readings WHERE taken_at >= ? ORDER BY sensor_id, taken_at", [
      monthStart(current - 3),
    ]);

    const done = await partitions().archiveBefore(current - 3, dir);
    expect(done.map((d) => [d.month, d.rows, d.outcome])).toEqual([
      [monthText(current - 5), 40, "archived"],
      [monthText(current - 4), 30, "archived"],
    ]);
    expect(await names()).toEqual([...[-3, -2, -1, 0, 1].map((k) => partitionName(current + k)), "pmax"]);
    expect(await ds.query("SELECT * FROM sensor_readings ORDER BY sensor_id, taken_at")).toEqual(later);
    expect(await countAll()).toBe(30);

    // The file: the table's columns, then one line a reading, NULLs as empty fields, every time in its month.
    const lines = gunzipSync(readFileSync(archiveFileOf(dir, current - 5)))
      .toString("utf8")
      .trimEnd()
      .split("\n");
    expect(lines[0]).toBe(
      "sensor_id,taken_at,air_temperature_c,relative_humidity_pct,surface_temperature_c,battery_pct,received_at",
    );
    expect(lines).toHaveLength(41);
    const first = timesIn(current - 5, 40)[0]!
      .toISOString()
      .slice(0, 19)
      .replace("T", " ");
    expect(lines[1]).toBe(`7,${first},20.50,61.25,,,${first}.000`);
    expect(lines.slice(1).every((l) => l.split(",")[1]!.startsWith(monthText(current - 5)))).toBe(true);

    // Run again: nothing left before the cut, nothing changed.
    expect(await partitions().archiveBefore(current - 3, dir)).toEqual([]);
    expect(await countAll()).toBe(30);
  });

  it("a dry run names the months and changes nothing", async () => {
    await addReadings(timesIn(current - 5, 12));
    const plan = await partitions().archiveBefore(current - 4, dir, { dryRun: true });
    expect(plan.map((p) => [p.partition, p.outcome])).toEqual([[partitionName(current - 5), "planned"]]);
    expect(await countAll()).toBe(12);
    expect(await names()).toContain(partitionName(current - 5));
  });

  it("refuses the current month, and a month that may still get late readings, changing nothing", async () => {
    await addReadings([...timesIn(current - 1, 5), ...timesIn(current, 5)]);
    const before = await names();
    // The 5th of the month: last month ended 4 days ago.
    const fifth = { now: () => new Date(monthStart(current).getTime() + 4 * 86_400_000 + 3_600_000) };
    const service = new ReadingPartitionService(ds, fifth);
    await expect(service.archiveBefore(current + 1, dir)).rejects.toBeInstanceOf(ValidationError);
    await expect(service.archiveBefore(current, dir)).rejects.toThrow(/cannot be archived yet/);
    expect(await names()).toEqual(before);
    expect(await countAll()).toBe(10);
  });

  it("finishes a month an interrupted run left in its holding table", async () => {
    await addReadings(timesIn(current - 5, 25));
    const held = `sensor_readings_out_${partitionName(current - 5)}`;
    // As far as an earlier run got before it stopped: the rows swapped out of the live table, no file yet.
    await ds.query(`CREATE TABLE ${held} LIKE sensor_readings`);
    await ds.query(`ALTER TABLE ${held} REMOVE PARTITIONING`);
    await ds.query(`ALTER TABLE sensor_readings EXCHANGE PARTITION ${partitionName(current - 5)} WITH TABLE ${held}`);
    rmSync(archiveFileOf(dir, current - 5), { force: true });

    const done = await partitions().archiveBefore(current - 4, dir);
    expect(done.map((d) => [d.month, d.rows])).toEqual([[monthText(current - 5), 25]]);
    expect(
      await ds.query("SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ?", [
        held,
      ]),
    ).toEqual([]);
    expect(await names()).not.toContain(partitionName(current - 5));
  });

  it("loads an archived month back into a partition of its own", async () => {
    await addReadings([...timesIn(current - 5, 15), ...timesIn(current - 4, 9)]);
    const all = await ds.query("SELECT * FROM sensor_readings ORDER BY sensor_id, taken_at");
    await partitions().archiveBefore(current - 3, dir);
    expect(await countAll()).toBe(0);

    expect(await partitions().restore(archiveFileOf(dir, current - 5))).toEqual({
      month: monthText(current - 5),
      rows: 15,
      added: 15,
    });
    expect(await names()).toEqual([...[-5, -4, -3, -2, -1, 0, 1].map((k) => partitionName(current + k)), "pmax"]);
    await partitions().restore(archiveFileOf(dir, current - 4));
    expect(await countIn(partitionName(current - 4))).toBe(9);
    // Loading one again adds nothing.
    expect((await partitions().restore(archiveFileOf(dir, current - 4))).added).toBe(0);
    expect(await ds.query("SELECT * FROM sensor_readings ORDER BY sensor_id, taken_at")).toEqual(all);
  });
});

it("the migration partitions a table already holding readings from its oldest month, and its down() undoes it", async () => {
  await ds.query("ALTER TABLE sensor_readings REMOVE PARTITIONING");
  await ds.query("TRUNCATE TABLE sensor_readings");
  // The migration reads the month from the database's own clock (migrations have no app clock).
  const [{ y, m }] = await ds.query("SELECT YEAR(UTC_TIMESTAMP()) AS y, MONTH(UTC_TIMESTAMP()) AS m");
  const dbMonth = Number(y) * 12 + Number(m) - 1;
  await addReadings([...timesIn(dbMonth - 14, 3), ...timesIn(dbMonth, 3)]);
  const migration = new SensorReadingsByMonth1796462200000();
  const runner = ds.createQueryRunner();
  try {
    await migration.up(runner);
    const expected = Array.from({ length: 18 }, (_, k) => partitionName(dbMonth - 14 + k));
    expect(await names()).toEqual([...expected, "pmax"]);
    expect(await countIn(partitionName(dbMonth - 14))).toBe(3);
    await migration.down(runner);
    expect(await names()).toEqual([]);
    expect(await countAll()).toBe(6);
  } finally {
    await runner.release();
  }
});
