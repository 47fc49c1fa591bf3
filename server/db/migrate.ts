// Migrations are their own deployment step (`npm run db:migrate`, server/migrate.ts); the server
// never migrates at start, and its readiness check reports pending migrations instead.
import type { DataSource } from "typeorm";

/** The names of the migrations this code has that the database has not run yet, in order. */
export async function pendingMigrations(dataSource: DataSource): Promise<string[]> {
  const table = dataSource.options.migrationsTableName ?? "migrations";
  const known = dataSource.migrations.map((m) => m.name ?? m.constructor.name);
  let ran: Set<string>;
  try {
    const rows: { name: string }[] = await dataSource.query(`SELECT name FROM \`${table}\``);
    ran = new Set(rows.map((r) => r.name));
  } catch (error) {
    // No migrations table yet: a fresh database, where every migration is pending.
    if ((error as { code?: string }).code === "ER_NO_SUCH_TABLE") return known;
    throw error;
  }
  return known.filter((name) => !ran.has(name));
}

/** Runs every pending migration, each in its own transaction; returns the names of those it ran. */
export async function migrateToLatest(dataSource: DataSource): Promise<string[]> {
  const ran = await dataSource.runMigrations({ transaction: "each" });
  return ran.map((m) => m.name);
}
