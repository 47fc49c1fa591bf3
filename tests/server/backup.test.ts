// Backup and restore (scripts/lib/backup.ts, behind `npm run backup` / `npm run restore`): a backup of a
// database with cases, readings and photos restores into a fresh database with the same rows, the
// same table checksums and byte-identical photo files; a damaged backup or a non-empty target is
// refused and changes nothing.
import { randomUUID } from "node:crypto";
import { cp, mkdtemp, readdir, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import mysql from "mysql2/promise";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { createDataSource } from "../../server/db/create-data-source.js";
import { S3ObjectStore } from "../../server/lib/storage.js";
import { ensureAppDatabase, rootSql } from "../../scripts/lib/mariadb.js";
import {
  BackupDamagedError,
  createBackup,
  restoreBackup,
  RestoreRefusedError,
  verifyBackup,
  type BackupResult,
  type DbTarget,
} from "../../scripts/lib/backup.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { jpegWithGps, png } from "../support/images.js";
import { createTestApp, signedInClient } from "../support/test-app.js";
import { daysAgo, testClock } from "../support/test-clock.js";

const testDb = inject("testDb");
const instance = { dir: testDb.dir, port: testDb.port };
const suffix = randomUUID().slice(0, 8);
const app = { name: "dewline", version: "0.0.0-test" };

// The source gets its own database, so other test files writing to the shared one cannot change
// it between the backup and the comparison. Restores go to fresh databases owned by ANOTHER account,
// as on a new machine (triggers must not keep the old account as their definer).
const source: DbTarget = {
  host: testDb.host,
  port: testDb.port,
  name: `bk_src_${suffix}`,
  user: `bk_src_${suffix}`,
  password: "backup-test-src",
};
const restoreUser = { user: `bk_rst_${suffix}`, password: "backup-test-restore" };
const created: string[] = [source.name];

async function freshDatabase(label: string): Promise<DbTarget> {
  const db = { host: testDb.host, port: testDb.port, name: `bk_${label}_${suffix}`, ...restoreUser };
  await ensureAppDatabase(instance, db);
  created.push(db.name);
  return db;
}

let work: string;
let sourceUploads: string;
let backup: BackupResult;

async function withConnection<T>(db: DbTarget, use: (c: mysql.Connection) => Promise<T>): Promise<T> {
  const c = await mysql.createConnection({
    host: db.host,
    port: db.port,
    user: db.user,
    password: db.password,
    database: db.name,
  });
  try {
    return await use(c);
  } finally {
    await c.end();
  }
}

/** Per table: row count, CHECKSUM TABLE and a SHA-256 of every row in primary-key order. */
async function snapshot(db: DbTarget) {
  return withConnection(db, async (c) => {
    const [tables] = await c.query<mysql.RowDataPacket[]>(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
    );
    const out: Record<string, { rows: number; checksum: string; rowsHash: string }> = {};
    for (const { name } of tables) {
      const [[count]] = await c.query<mysql.RowDataPacket[]>(`SELECT COUNT(*) AS n FROM \`${name}\``);
      const [[sum]] = await c.query<mysql.RowDataPacket[]>(`CHECKSUM TABLE \`${name}\` EXTENDED`);
      const [rows] = await c.query<mysql.RowDataPacket[]>({
        sql: `SELECT * FROM \`${name}\` ORDER BY 1`,
        rowsAsArray: true,
        dateStrings: true,
      });
      out[String(name)] = { rows: Number(count!.n), checksum: String(sum!.Checksum), rowsHash: JSON.stringify(rows) };
    }
    return out;
  });
}

const tableCount = (db: DbTarget) =>
  withConnection(db, async (c) => {
    const [[row]] = await c.query<mysql.RowDataPacket[]>(
      "SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE()",
    );
    return Number(row!.n);
  });

/** Every file under a folder, relative path → bytes. */
async function filesUnder(root: string): Promise<Map<string, Buffer>> {
  const out = new Map<string, Buffer>();
  for (const entry of await readdir(root, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    const full = path.join(entry.parentPath, entry.name);
    out.set(path.relative(root, full), await readFile(full));
  }
  return out;
}

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), "dewline-backup-test-"));
  sourceUploads = path.join(work, "uploads-source");
  await ensureAppDatabase(instance, source);
  const ds = createDataSource(source);
  await ds.initialize();
  await ds.runMigrations({ transaction: "each" });
  await ds.destroy();

  const t = await createTestApp({
    DB_NAME: source.name,
    DB_USER: source.user,
    DB_PASSWORD: source.password,
    UPLOADS_DIR: sourceUploads,
  });
  try {
    for (const n of [1, 2]) {
      const landlord = await makeLandlord(t.ctx.dataSource);
      const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
      const home = (await tenant.get("/api/me/home").expect(200)).body.property;
      const bedroomId = home.rooms.find((r: { kind: string }) => r.kind === "bedroom").id;
      const caseId = (
        await tenant
          .post("/api/cases", {
            // Quotes, brackets, a backslash, a line break and an emoji: the dump's row counter must not be fooled.
            description: `Home ${n}: it's (really) "black" behind the wardrobe \\ since May;\nsmells musty 🍄 (x, y), ('a')`,
            locations: ["behind-furniture"],
            observations: ["mould-spots"],
            roomIds: [bedroomId],
          })
          .expect(201)
      ).body.id;
      const base = Math.floor(daysAgo(5).getTime() / 3_600_000) * 3_600_000;
      const readings = Array.from({ length: 40 }, (_, i) => ({
        roomId: bedroomId,
        takenAt: new Date(base + i * 3_600_000).toISOString(),
        airTemperatureC: 18 + (i % 4),
        relativeHumidityPct: 60 + (i % 25),
        surfaceTemperatureC: 10 + (i % 3),
      }));
      await tenant.post(`/api/cases/${caseId}/readings`, readings).expect(201);
      await tenant.agent
        .post(`/api/cases/${caseId}/photos`)
        .set("X-CSRF-Token", tenant.csrf)
        .attach("photos", await jpegWithGps(800, 600, n), "wall.jpg")
        .attach("photos", await png(320 + n, 240), "window.png")
        .expect(201);
    }
  } finally {
    // The app and its background jobs stop here, so nothing changes the source after the backup.
    await t.close();
  }
  backup = await createBackup({
    db: source,
    uploadsDir: sourceUploads,
    backupsDir: path.join(work, "backups"),
    now: testClock.now,
    app,
  });
});

afterAll(async () => {
  await rootSql(
    instance,
    [
      ...created.map((name) => `DROP DATABASE IF EXISTS \`${name}\``),
      `DROP USER IF EXISTS '${source.user}'@'127.0.0.1'`,
      `DROP USER IF EXISTS '${restoreUser.user}'@'127.0.0.1'`,
    ].join(";\n"),
  ).catch(() => undefined);
  if (work) await rm(work, { recursive: true, force: true });
});

describe("npm run backup", () => {
  it("writes the dump, the photos, a manifest and checksums into a timestamped folder", async () => {
    const m = backup.manifest;
    expect(path.basename(backup.dir)).toMatch(/^dewline-\d{4}-\d\d-\d\dT\d\d-\d\d-\d\dZ$/);
    expect(m.app).toEqual(app);
    expect(Date.parse(m.createdAt)).toBeLessThanOrEqual(testClock.now().getTime());
    expect(m.database.migrations.length).toBeGreaterThan(10);
    // The counts in the manifest are the source's (nothing has written to it since).
    const before = await snapshot(source);
    expect(m.database.tables).toEqual(Object.fromEntries(Object.entries(before).map(([name, t]) => [name, t.rows])));
    expect(m.database.tables.cases).toBe(2);
    expect(m.database.tables.readings).toBe(80);
    expect(m.database.tables.photos).toBe(4);
    // Display copy and thumbnail of each photo, byte for byte the same as the store.
    const store = await filesUnder(sourceUploads);
    expect(m.photos.count).toBe(8);
    expect(m.photos.files.map((f) => f.path.replace(/^photos\//, "")).sort()).toEqual([...store.keys()].sort());
    const copied = await filesUnder(path.join(backup.dir, "photos"));
    for (const [rel, bytes] of store) expect(copied.get(rel)?.equals(bytes), rel).toBe(true);
    const sums = await readFile(path.join(backup.dir, "SHA256SUMS"), "utf8");
    expect(sums).toContain(`${m.database.dump.sha256}  database.sql.gz`);
    expect(sums.trim().split("\n")).toHaveLength(1 + 1 + 8);
    await expect(verifyBackup(backup.dir)).resolves.toEqual(m);
  });
});

describe("npm run restore", () => {
  let target: DbTarget;
  let targetUploads: string;

  it("restores into a fresh database: same rows, same table checksums, byte-identical photo files", async () => {
    target = await freshDatabase("fresh");
    targetUploads = path.join(work, "uploads-restored");
    const summary = await restoreBackup({ dir: backup.dir, db: target, uploadsDir: targetUploads });
    expect(summary.photos).toMatchObject({ restored: 8, alreadyPresent: 0 });
    expect(summary.replacedTables).toBe(0);

    const [from, to] = [await snapshot(source), await snapshot(target)];
    expect(Object.keys(to)).toEqual(Object.keys(from));
    for (const name of Object.keys(from)) expect(to[name], name).toEqual(from[name]);
    const [a, b] = [await filesUnder(sourceUploads), await filesUnder(targetUploads)];
    expect([...b.keys()].sort()).toEqual([...a.keys()].sort());
    for (const [rel, bytes] of a) expect(b.get(rel)?.equals(bytes), rel).toBe(true);

    // The restored triggers work: case events stay append-only.
    await expect(withConnection(target, (c) => c.query("DELETE FROM case_events"))).rejects.toThrow(/append-only/);
  });

  it("refuses a database that already has tables, changing nothing, unless --force", async () => {
    const before = await snapshot(target);
    await expect(restoreBackup({ dir: backup.dir, db: target, uploadsDir: path.join(work, "uploads-empty") })).rejects.toThrow(
      RestoreRefusedError,
    );
    await expect(restoreBackup({ dir: backup.dir, db: target, uploadsDir: path.join(work, "uploads-empty") })).rejects.toThrow(
      /Refusing to restore: the database bk_fresh_\w+ has \d+ tables\. Nothing was changed\..*--force/,
    );
    expect(await snapshot(target)).toEqual(before);

    // A later row, then --force puts the backup's state back.
    await withConnection(target, (c) => c.query("INSERT INTO organisations (name) VALUES ('Added after the backup')"));
    const summary = await restoreBackup({ dir: backup.dir, db: target, uploadsDir: targetUploads, force: true });
    expect(summary.replacedTables).toBeGreaterThan(10);
    expect(summary.photos).toMatchObject({ restored: 0, alreadyPresent: 8 });
    expect(await snapshot(target)).toEqual(await snapshot(source));
  });

  it("refuses a photo store that already has files, unless --force", async () => {
    const db = await freshDatabase("store");
    await expect(restoreBackup({ dir: backup.dir, db, uploadsDir: targetUploads })).rejects.toThrow(
      /Refusing to restore: the photo store .* has 8 files\. Nothing was changed\./,
    );
    expect(await tableCount(db)).toBe(0);
  });

  const tamperings: [string, (dir: string) => Promise<void>, RegExp][] = [
    [
      "a photo file changed",
      async (dir) => {
        const file = path.join(dir, backup.manifest.photos.files[0]!.path);
        const bytes = await readFile(file);
        bytes[bytes.length >> 1] ^= 0xff;
        await writeFile(file, bytes);
      },
      /photos\/.*: its SHA-256 does not match/,
    ],
    [
      "the dump cut short",
      async (dir) =>
        writeFile(path.join(dir, "database.sql.gz"), (await readFile(path.join(dir, "database.sql.gz"))).subarray(0, 200)),
      /database\.sql\.gz: 200 bytes/,
    ],
    ["a photo file missing", async (dir) => rm(path.join(dir, backup.manifest.photos.files[3]!.path)), /photos\/.* is missing/],
    [
      "a row count edited in the manifest",
      async (dir) => {
        const file = path.join(dir, "manifest.json");
        await writeFile(file, (await readFile(file, "utf8")).replace('"readings": 80', '"readings": 81'));
      },
      /manifest\.json does not match its checksum/,
    ],
    [
      "a file added",
      async (dir) => writeFile(path.join(dir, "photos", "extra.jpg"), "not from the backup"),
      /photos\/extra\.jpg is not listed/,
    ],
  ];
  it.each(tamperings)(
    "refuses a damaged backup (%s) with a clear message and changes nothing",
    async (_label, tamper, message) => {
      const dir = path.join(work, `tampered-${randomUUID().slice(0, 6)}`);
      await cp(backup.dir, dir, { recursive: true });
      await tamper(dir);
      const db = await freshDatabase(`t${randomUUID().slice(0, 4)}`);
      const uploads = path.join(work, `uploads-${path.basename(dir)}`);
      const attempt = restoreBackup({ dir, db, uploadsDir: uploads, force: true });
      await expect(attempt).rejects.toThrow(BackupDamagedError);
      await expect(attempt).rejects.toThrow(message);
      await expect(attempt).rejects.toThrow(/nothing was restored and nothing was changed/);
      expect(await tableCount(db)).toBe(0);
      await expect(readdir(uploads)).rejects.toThrow(/ENOENT/);
      // The original backup is unharmed.
      await expect(verifyBackup(backup.dir)).resolves.toBeTruthy();
    },
  );
});

describe("a backup while the app writes", () => {
  it("counts rows in the dump's own snapshot, so what is restored matches the manifest exactly", async () => {
    let writing = true;
    let written = 0;
    const writer = withConnection(source, async (c) => {
      while (writing) {
        await c.query("INSERT INTO organisations (name) VALUES (?)", [`Written during the backup ${written}`]);
        written++;
      }
    });
    let result: BackupResult;
    try {
      // Let the writer get going first; wait for a state, not for time.
      while (written < 20) await new Promise((r) => setImmediate(r));
      result = await createBackup({
        db: source,
        uploadsDir: sourceUploads,
        backupsDir: path.join(work, "backups"),
        now: testClock.now,
        app,
      });
    } finally {
      writing = false;
      await writer;
    }
    const target = await freshDatabase("busy");
    const summary = await restoreBackup({ dir: result.dir, db: target, uploadsDir: path.join(work, "uploads-busy") });
    expect(summary.tables).toEqual(result.manifest.database.tables);
    expect(result.manifest.database.tables.organisations).toBeGreaterThanOrEqual(2 + 20);
  });
});

describe("with STORAGE_DRIVER=s3 (the photos in a bucket)", () => {
  it("restores the photos into the bucket and backs them up from there, byte for byte", async () => {
    const s3rver = new S3rver({
      address: "127.0.0.1",
      port: 0,
      silent: true,
      directory: path.join(work, "s3rver"),
      configureBuckets: [{ name: "restored-photos" }],
    });
    const { port } = await s3rver.run();
    const bucket = new S3ObjectStore({
      endpoint: `http://127.0.0.1:${port}`,
      region: "us-east-1",
      bucket: "restored-photos",
      accessKeyId: "S3RVER",
      secretAccessKey: "S3RVER",
      forcePathStyle: true,
    });
    try {
      // The disk backup into a bucket: how an installation moves its photos from disk to S3.
      const target = await freshDatabase("s3");
      const uploads = path.join(work, "uploads-s3");
      const summary = await restoreBackup({ dir: backup.dir, db: target, uploadsDir: uploads, photoStore: bucket });
      expect(summary.photos).toMatchObject({ restored: 8, alreadyPresent: 0 });
      const original = await filesUnder(sourceUploads);
      expect((await bucket.list()).map((o) => o.key).sort()).toEqual([...original.keys()].sort());
      for (const [key, bytes] of original) expect((await bucket.read(key)).equals(bytes), key).toBe(true);
      // Nothing was written to the local folder.
      await expect(readdir(uploads)).rejects.toThrow(/ENOENT/);

      // A second restore finds every object already in place, and refuses without --force.
      await expect(restoreBackup({ dir: backup.dir, db: target, uploadsDir: uploads, photoStore: bucket })).rejects.toThrow(
        /the s3 photo store has 8 files/,
      );
      const again = await restoreBackup({ dir: backup.dir, db: target, uploadsDir: uploads, photoStore: bucket, force: true });
      expect(again.photos).toMatchObject({ restored: 0, alreadyPresent: 8 });

      // And back out of the bucket: the same photo files as the first backup.
      const fromBucket = await createBackup({
        db: target,
        uploadsDir: uploads,
        photoStore: bucket,
        backupsDir: path.join(work, "backups-s3"),
        now: testClock.now,
        app,
      });
      const strip = (files: { path: string; sha256: string; size: number }[]) =>
        [...files].sort((a, b) => (a.path < b.path ? -1 : 1));
      expect(strip(fromBucket.manifest.photos.files)).toEqual(strip(backup.manifest.photos.files));
    } finally {
      await bucket.close();
      await s3rver.close();
    }
  });
});
