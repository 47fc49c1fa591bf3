// The migrations, on a database of this file's own in the run's throwaway MariaDB: migrated to the
// latest, the schema matches the entities (no drift: the check `npm run migration:check` makes), the
// latest migration's down() undoes it exactly and up() applies it again, and readiness follows.
import request from "supertest";
import type { DataSource } from "typeorm";
import { afterAll, beforeAll, expect, inject, it } from "vitest";
import { ensureAppDatabase } from "../../scripts/lib/mariadb.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { migrateToLatest, pendingMigrations } from "../../server/db/migrate.js";
import { createTestApp, type TestApp } from "../support/test-app.js";

const testDb = inject("testDb");
const db = { name: "dewline_migrations", user: "dewline_migrations", password: "migrations-only" };
let ds: DataSource;
let t: TestApp;

beforeAll(async () => {
  await ensureAppDatabase({ dir: testDb.dir, port: testDb.port }, db);
  ds = createDataSource({ host: testDb.host, port: testDb.port, ...db });
  await ds.initialize();
  t = await createTestApp({ DB_NAME: db.name, DB_USER: db.user, DB_PASSWORD: db.password });
});

afterAll(async () => {
  await t?.close();
  if (ds?.isInitialized) {
    await ds.query(`DROP DATABASE \`${db.name}\``);
    await ds.destroy();
  }
});

/** The SQL TypeORM would generate to bring the database in line with the entities (empty: no drift). */
async function drift(): Promise<string[]> {
  const sql = await ds.driver.createSchemaBuilder().log();
  return sql.upQueries.map((q) => q.query);
}

/** Tables, columns, indexes and triggers as MariaDB reports them, to compare before and after. */
async function schemaSnapshot(): Promise<string> {
  const parts = await Promise.all([
    ds.query(
      "SELECT TABLE_NAME, COLUMN_NAME, COLUMN_TYPE, IS_NULLABLE, COLUMN_DEFAULT, EXTRA FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = ? ORDER BY TABLE_NAME, COLUMN_NAME",
      [db.name],
    ),
    ds.query(
      "SELECT TABLE_NAME, INDEX_NAME, SEQ_IN_INDEX, COLUMN_NAME, NON_UNIQUE, COLLATION FROM information_schema.STATISTICS WHERE TABLE_SCHEMA = ? ORDER BY TABLE_NAME, INDEX_NAME, SEQ_IN_INDEX",
      [db.name],
    ),
    ds.query(
      "SELECT TABLE_NAME, CONSTRAINT_NAME, COLUMN_NAME, REFERENCED_TABLE_NAME, REFERENCED_COLUMN_NAME FROM information_schema.KEY_COLUMN_USAGE WHERE TABLE_SCHEMA = ? AND TABLE_NAME <> 'migrations' ORDER BY TABLE_NAME, CONSTRAINT_NAME, COLUMN_NAME",
      [db.name],
    ),
    ds.query(
      "SELECT TRIGGER_NAME, EVENT_OBJECT_TABLE, ACTION_TIMING, EVENT_MANIPULATION FROM information_schema.TRIGGERS WHERE TRIGGER_SCHEMA = ? ORDER BY TRIGGER_NAME",
      [db.name],
    ),
    // Partitioning is schema too (sensor_readings by month): its down() changes no column or index.
    ds.query(
      "SELECT TABLE_NAME, PARTITION_NAME, PARTITION_METHOD, PARTITION_EXPRESSION, PARTITION_DESCRIPTION FROM information_schema.PARTITIONS WHERE TABLE_SCHEMA = ? AND PARTITION_NAME IS NOT NULL ORDER BY TABLE_NAME, PARTITION_ORDINAL_POSITION",
      [db.name],
    ),
  ]);
  return JSON.stringify(parts);
}

it("a fresh database has every migration pending, is unready, and after migrating to the latest has no drift from the entities", async () => {
  expect(await pendingMigrations(ds)).toEqual(ds.migrations.map((m) => m.name));
  const unready = await request(t.app).get("/api/health/ready").expect(503);
  expect(unready.body).toMatchObject({ status: "unready", reason: "migrations_pending" });

  const ran = await migrateToLatest(ds);
  expect(ran).toEqual(ds.migrations.map((m) => m.name));
  expect(await pendingMigrations(ds)).toEqual([]);
  expect(await drift(), "the entities and the migrations disagree: generate a migration").toEqual([]);
  await request(t.app).get("/api/health/ready").expect(200, { status: "ready" });
});

it("the latest migration's down() undoes exactly its up(), and up() applies it again", async () => {
  expect(await pendingMigrations(ds)).toEqual([]);
  const latest = ds.migrations.at(-1)?.name;
  const migrated = await schemaSnapshot();

  await ds.undoLastMigration({ transaction: "each" });
  expect(await pendingMigrations(ds)).toEqual([latest]);
  expect(await schemaSnapshot(), "down() changed nothing in the schema").not.toBe(migrated);
  const unready = await request(t.app).get("/api/health/ready").expect(503);
  expect(unready.body).toMatchObject({ status: "unready", reason: "migrations_pending", pending: [latest] });

  expect(await migrateToLatest(ds)).toEqual([latest]);
  expect(await schemaSnapshot()).toBe(migrated);
  expect(await drift()).toEqual([]);
  await request(t.app).get("/api/health/ready").expect(200);
});
