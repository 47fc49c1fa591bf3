// Backup and restore of one Dewline installation: the app database (mariadb-dump in one snapshot,
// gzip) and the photo store (the UPLOADS_DIR folder, or with STORAGE_DRIVER=s3 the bucket, given as
// `photoStore`), with a manifest and checksums. `npm run backup` and
// `npm run restore` are thin wrappers; the tests call these functions directly.
//
// What a backup guarantees:
// - The dump is one InnoDB snapshot (--single-transaction): every table as of one instant.
// - The manifest's row counts are counted from the dump's own INSERT statements while it streams,
//   so they describe exactly that snapshot, however busy the app is meanwhile.
// - Photo files are copied after the snapshot. The app writes a photo's files before it commits the
//   row, so every photo row in the dump has its files in the copy (unless a photo was deleted in
//   between, which restore reports). Files newer than the snapshot are copied too, harmlessly.
import { spawn } from "node:child_process";
import { createHash, type Hash } from "node:crypto";
import { createReadStream, createWriteStream } from "node:fs";
import { chmod, copyFile, mkdir, mkdtemp, readdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Transform, type TransformCallback } from "node:stream";
import { pipeline } from "node:stream/promises";
import { createGunzip, createGzip } from "node:zlib";
import mysql from "mysql2/promise";
import type { ObjectStore } from "../../server/lib/storage.js";

export interface DbTarget {
  host: string;
  port: number;
  name: string;
  user: string;
  password: string;
}

export interface FileEntry {
  /** Relative to the backup folder, with forward slashes. */
  path: string;
  size: number;
  sha256: string;
}

export interface Manifest {
  format: "dewline-backup";
  formatVersion: 1;
  app: { name: string; version: string };
  createdAt: string;
  database: {
    name: string;
    serverVersion: string;
    /** TypeORM's migrations table, oldest first: the schema version the dump holds. */
    migrations: string[];
    /** Rows per table, counted in the dump itself. */
    tables: Record<string, number>;
    dump: FileEntry & { compression: "gzip"; uncompressedSize: number; uncompressedSha256: string };
  };
  photos: { count: number; bytes: number; files: FileEntry[] };
}

export const MANIFEST_FILE = "manifest.json";
export const CHECKSUMS_FILE = "SHA256SUMS";
const DUMP_FILE = "database.sql.gz";
const PHOTOS_DIR = "photos";

/** Folders and files in the photo store that are work in progress, never part of a backup. */
const SKIPPED_DIRS = new Set(["tmp", "temp", "incoming", "upload-tmp", "uploads-tmp"]);
const isSkipped = (name: string, isDir: boolean) =>
  name.startsWith(".") || (isDir ? SKIPPED_DIRS.has(name.toLowerCase()) : /\.(tmp|part|partial)$/i.test(name));

/** A backup folder that failed its checks; nothing was changed. */
export class BackupDamagedError extends Error {
  constructor(readonly problems: string[]) {
    super(
      `The backup is damaged or incomplete, so nothing was restored and nothing was changed:\n` +
        problems.map((p) => `  - ${p}`).join("\n"),
    );
    this.name = "BackupDamagedError";
  }
}

/** The target is not empty and --force was not given; nothing was changed. */
export class RestoreRefusedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RestoreRefusedError";
  }
}

/** The restore ran but what is now in place does not match the manifest. */
export class RestoreMismatchError extends Error {
  constructor(readonly problems: string[]) {
    super(`The restored data does not match the backup's manifest:\n${problems.map((p) => `  - ${p}`).join("\n")}`);
    this.name = "RestoreMismatchError";
  }
}

const quoteId = (s: string) => "`" + s.replace(/`/g, "``") + "`";
const sha256File = async (file: string) => {
  const hash = createHash("sha256");
  await pipeline(createReadStream(file), hash);
  return hash.digest("hex");
};
const toPosix = (p: string) => p.split(path.sep).join("/");

/** A stamp safe in a folder name: 2026-12-03T14-05-09Z. */
const folderStamp = (d: Date) =>
  d
    .toISOString()
    .replace(/\.\d{3}Z$/, "Z")
    .replace(/:/g, "-");

/**
 * mariadb-dump and mariadb read the credentials from a private option file, never the command
 * line (which every user of the machine can see in `ps`).
 */
async function withOptionFile<T>(db: DbTarget, use: (file: string) => Promise<T>): Promise<T> {
  const dir = await mkdtemp(path.join(os.tmpdir(), "dewline-db-opts-"));
  const file = path.join(dir, "client.cnf");
  const escape = (v: string) => v.replace(/\\/g, "\\\\").replace(/"/g, '\\"');
  try {
    await writeFile(
      file,
      `[client]\nhost="${escape(db.host)}"\nport=${db.port}\nuser="${escape(db.user)}"\npassword="${escape(db.password)}"\nprotocol=TCP\n`,
      { mode: 0o600 },
    );
    await chmod(file, 0o600);
    return await use(file);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

function connect(db: DbTarget) {
  return mysql
    .createConnection({
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.name,
      multipleStatements: true,
    })
    .catch((error: unknown) => {
      const why = error instanceof Error ? error.message : String(error);
      throw new Error(
        `Cannot reach the database ${db.name} at ${db.host}:${db.port} as ${db.user} (${why}). ` +
          "Is MariaDB running (npm run db:start) and are DB_* set as for the app?",
        { cause: error },
      );
    });
}

/**
 * Runs a program with its stdin or stdout joined to a stream pipeline; resolves when both the
 * pipeline and the program are done. When the program fails, its own message (the end of its
 * stderr) wins over the broken pipe it causes.
 */
async function runPiped(
  command: string,
  args: string[],
  join: (child: ReturnType<typeof spawn>) => Promise<void>,
  io: "stdin" | "stdout",
) {
  const child = spawn(command, args, {
    stdio: [io === "stdin" ? "pipe" : "ignore", io === "stdout" ? "pipe" : "ignore", "pipe"],
  });
  let stderr = "";
  child.stderr!.setEncoding("utf8");
  child.stderr!.on("data", (chunk: string) => {
    stderr = (stderr + chunk).slice(-4000);
  });
  const exited = new Promise<void>((resolve, reject) => {
    child.once("error", reject);
    child.once("close", (code, signal) => {
      if (code === 0) resolve();
      else reject(new Error(`${command} failed (${signal ?? `exit ${code}`}): ${stderr.trim() || "no message"}`));
    });
  });
  const [piped, ran] = await Promise.allSettled([join(child), exited]);
  if (ran.status === "rejected") throw ran.reason;
  if (piped.status === "rejected") throw piped.reason;
}

/** Hashes and counts the bytes that pass through. */
class Tap extends Transform {
  readonly hash: Hash = createHash("sha256");
  bytes = 0;
  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback) {
    this.hash.update(chunk);
    this.bytes += chunk.length;
    done(null, chunk);
  }
}

const INSERT_PREFIX = Buffer.from("INSERT INTO `");
const CREATE_PREFIX = Buffer.from("CREATE TABLE `");

/** The table name after a prefix like "INSERT INTO `", up to the closing backtick (`` is an escaped one). */
function nameAfter(line: Buffer, prefixLength: number): { name: string; end: number } {
  let i = prefixLength;
  const bytes: number[] = [];
  while (i < line.length) {
    if (line[i] === 0x60) {
      if (line[i + 1] === 0x60) {
        bytes.push(0x60);
        i += 2;
        continue;
      }
      break;
    }
    bytes.push(line[i]!);
    i++;
  }
  return { name: Buffer.from(bytes).toString("utf8"), end: i + 1 };
}

/**
 * Counts the rows of INSERT statements in a dump, line by line. mariadb-dump writes an INSERT as
 * "INSERT INTO `t` VALUES" followed by its tuples (one line per tuple since MariaDB 10.x, or all on
 * one line before), ending at a top-level ";". Strings are quoted with backslash escapes, so a line
 * break in data is "\n" and never splits a line; with --hex-blob binary data is 0x… outside quotes.
 */
function scanValues(line: Buffer, from: number): { rows: number; ended: boolean } {
  let rows = 0;
  let depth = 0;
  let quoted = false;
  let escaped = false;
  for (let i = from; i < line.length; i++) {
    const b = line[i];
    if (quoted) {
      if (escaped) escaped = false;
      else if (b === 0x5c) escaped = true;
      else if (b === 0x27) quoted = false;
    } else if (b === 0x27) quoted = true;
    else if (b === 0x28) {
      if (depth === 0) rows++;
      depth++;
    } else if (b === 0x29) depth--;
    else if (b === 0x3b && depth === 0) return { rows, ended: true };
  }
  return { rows, ended: false };
}

/** Splits a SQL dump into lines; counts tables and rows; can rewrite the lines that are not data. */
class DumpLines extends Transform {
  readonly tables = new Map<string, number>();
  private rest: Buffer = Buffer.alloc(0);
  /** The table whose INSERT statement is open, if any. */
  private inserting: string | null = null;
  constructor(private readonly rewrite?: (line: string) => string) {
    super();
  }
  private count(table: string, line: Buffer, from: number) {
    const { rows, ended } = scanValues(line, from);
    this.tables.set(table, (this.tables.get(table) ?? 0) + rows);
    this.inserting = ended ? null : table;
  }
  private line(line: Buffer): Buffer {
    if (this.inserting !== null) {
      this.count(this.inserting, line, 0);
      return line;
    }
    if (line.subarray(0, INSERT_PREFIX.length).equals(INSERT_PREFIX)) {
      const { name, end } = nameAfter(line, INSERT_PREFIX.length);
      this.count(name, line, end);
      return line;
    }
    if (line.subarray(0, CREATE_PREFIX.length).equals(CREATE_PREFIX)) {
      const { name } = nameAfter(line, CREATE_PREFIX.length);
      if (!this.tables.has(name)) this.tables.set(name, 0);
    }
    return this.rewrite ? Buffer.from(this.rewrite(line.toString("utf8")), "utf8") : line;
  }
  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback) {
    const data = this.rest.length ? Buffer.concat([this.rest, chunk]) : chunk;
    const out: Buffer[] = [];
    let start = 0;
    for (let nl = data.indexOf(0x0a, start); nl !== -1; nl = data.indexOf(0x0a, start)) {
      out.push(this.line(data.subarray(start, nl)), Buffer.from("\n"));
      start = nl + 1;
    }
    this.rest = Buffer.from(data.subarray(start));
    done(null, out.length ? Buffer.concat(out) : undefined);
  }
  override _flush(done: TransformCallback) {
    done(null, this.rest.length ? this.line(this.rest) : undefined);
  }
}

/** Every regular file of the photo store, relative paths, skipping temp and hidden entries. */
async function listPhotoFiles(root: string): Promise<string[]> {
  const out: string[] = [];
  const walk = async (rel: string) => {
    let entries;
    try {
      entries = await readdir(path.join(root, rel), { withFileTypes: true });
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === "ENOENT" && rel === "") return;
      throw error;
    }
    for (const entry of entries) {
      const child = rel ? path.join(rel, entry.name) : entry.name;
      if (isSkipped(entry.name, entry.isDirectory())) continue;
      if (entry.isDirectory()) await walk(child);
      else if (entry.isFile()) out.push(child);
    }
  };
  await walk("");
  return out.sort();
}

/**
 * The photo store as backup and restore see it: relative names (the object keys), whole files.
 * Either the UPLOADS_DIR folder itself or, when `photoStore` is given (STORAGE_DRIVER=s3), the store.
 */
interface PhotoSide {
  /** For messages: the folder or "the s3 store". */
  name: string;
  list(): Promise<string[]>;
  read(rel: string): Promise<Buffer>;
  /** null when there is no such file or object. */
  sha256(rel: string): Promise<string | null>;
  /** Puts the backup's copy in place whole: a half-written file never sits under a photo's name. */
  write(rel: string, source: string): Promise<void>;
  has(rel: string): Promise<boolean>;
}

function folderSide(root: string): PhotoSide {
  return {
    name: root,
    list: () => listPhotoFiles(root),
    read: (rel) => readFile(path.join(root, rel)),
    sha256: async (rel) => ((await exists(path.join(root, rel))) ? sha256File(path.join(root, rel)) : null),
    async write(rel, source) {
      const dest = path.join(root, rel);
      await mkdir(path.dirname(dest), { recursive: true });
      const temp = `${dest}.restore.tmp`;
      await copyFile(source, temp);
      await rename(temp, dest);
    },
    has: (rel) => exists(path.join(root, rel)),
  };
}

function storeSide(store: ObjectStore): PhotoSide {
  const sha256 = async (rel: string) => {
    try {
      const hash = createHash("sha256");
      await pipeline((await store.get(rel)).body, hash);
      return hash.digest("hex");
    } catch (error) {
      if ((error as { code?: unknown }).code === "object_not_found") return null;
      throw error;
    }
  };
  return {
    name: `the ${store.driver} photo store`,
    list: async () => (await store.list("")).map((o) => o.key),
    read: (rel) => store.read(rel),
    sha256,
    // Photos are JPEGs (server/modules/photos); anything else goes back as plain bytes.
    write: async (rel, source) =>
      store.put(rel, await readFile(source), { contentType: /\.jpe?g$/i.test(rel) ? "image/jpeg" : "application/octet-stream" }),
    has: (rel) => store.exists(rel),
  };
}

export interface BackupOptions {
  db: DbTarget;
  uploadsDir: string;
  /** With STORAGE_DRIVER=s3: the store the photos are in (uploadsDir then holds only uploads in progress). */
  photoStore?: ObjectStore;
  backupsDir: string;
  now: () => Date;
  app: { name: string; version: string };
}

export interface BackupResult {
  dir: string;
  manifest: Manifest;
}

/**
 * Writes <backupsDir>/dewline-<time>/ with database.sql.gz, photos/…, manifest.json and SHA256SUMS.
 * It is built under a ".partial" name and renamed only when complete, so an interrupted backup
 * never looks like a finished one.
 */
export async function createBackup(opts: BackupOptions): Promise<BackupResult> {
  const createdAt = opts.now();
  await mkdir(opts.backupsDir, { recursive: true });
  let name = `dewline-${folderStamp(createdAt)}`;
  for (let n = 2; await exists(path.join(opts.backupsDir, name)); n++) name = `dewline-${folderStamp(createdAt)}-${n}`;
  const finalDir = path.join(opts.backupsDir, name);
  const work = `${finalDir}.partial`;
  await rm(work, { recursive: true, force: true });
  // Personal data and password hashes: readable by this account only.
  await mkdir(work, { mode: 0o700 });
  await mkdir(path.join(work, PHOTOS_DIR));
  try {
    const conn = await connect(opts.db);
    let serverVersion: string;
    let migrations: string[];
    try {
      const [[version]] = await conn.query<mysql.RowDataPacket[]>("SELECT VERSION() AS v");
      serverVersion = String(version!.v);
      const [hasTable] = await conn.query<mysql.RowDataPacket[]>(
        "SELECT 1 FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'migrations'",
      );
      migrations = hasTable.length
        ? (await conn.query<mysql.RowDataPacket[]>("SELECT name FROM migrations ORDER BY id"))[0].map((r) => String(r.name))
        : [];
    } finally {
      await conn.end();
    }

    const raw = new Tap();
    const lines = new DumpLines();
    const gz = new Tap();
    const dumpPath = path.join(work, DUMP_FILE);
    await withOptionFile(opts.db, async (optionFile) => {
      await runPiped(
        "mariadb-dump",
        [
          `--defaults-file=${optionFile}`,
          "--single-transaction",
          "--quick",
          "--routines",
          "--triggers",
          "--events",
          "--hex-blob",
          "--default-character-set=utf8mb4",
          "--tz-utc",
          opts.db.name,
        ],
        (child) => pipeline(child.stdout!, raw, lines, createGzip({ level: 6 }), gz, createWriteStream(dumpPath)),
        "stdout",
      );
    });

    // Photos after the snapshot (see the top of this file). Each file is hashed as it is copied.
    const files: FileEntry[] = [];
    let bytes = 0;
    const photos = opts.photoStore ? storeSide(opts.photoStore) : folderSide(opts.uploadsDir);
    for (const rel of await photos.list()) {
      const data = await photos.read(rel);
      const dest = path.join(work, PHOTOS_DIR, rel);
      await mkdir(path.dirname(dest), { recursive: true });
      await writeFile(dest, data, { flag: "wx" });
      files.push({
        path: toPosix(path.join(PHOTOS_DIR, rel)),
        size: data.length,
        sha256: createHash("sha256").update(data).digest("hex"),
      });
      bytes += data.length;
    }

    const manifest: Manifest = {
      format: "dewline-backup",
      formatVersion: 1,
      app: opts.app,
      createdAt: createdAt.toISOString(),
      database: {
        name: opts.db.name,
        serverVersion,
        migrations,
        tables: Object.fromEntries([...lines.tables.entries()].sort(([a], [b]) => a.localeCompare(b))),
        dump: {
          path: DUMP_FILE,
          size: gz.bytes,
          sha256: gz.hash.digest("hex"),
          compression: "gzip",
          uncompressedSize: raw.bytes,
          uncompressedSha256: raw.hash.digest("hex"),
        },
      },
      photos: { count: files.length, bytes, files },
    };
    const manifestText = JSON.stringify(manifest, null, 2) + "\n";
    await writeFile(path.join(work, MANIFEST_FILE), manifestText);
    // The usual `sha256sum` format, so `sha256sum -c SHA256SUMS` in the folder checks it by hand.
    const sums = [
      { path: MANIFEST_FILE, sha256: createHash("sha256").update(manifestText).digest("hex") },
      manifest.database.dump,
      ...files,
    ];
    await writeFile(path.join(work, CHECKSUMS_FILE), sums.map((f) => `${f.sha256}  ${f.path}\n`).join(""));
    await rename(work, finalDir);
    return { dir: finalDir, manifest };
  } catch (error) {
    await rm(work, { recursive: true, force: true });
    throw error;
  }
}

async function exists(p: string): Promise<boolean> {
  try {
    await stat(p);
    return true;
  } catch {
    return false;
  }
}

/** Every file of the backup folder (relative, forward slashes). */
async function listAll(root: string): Promise<string[]> {
  const out: string[] = [];
  const walk = async (rel: string) => {
    for (const entry of await readdir(path.join(root, rel), { withFileTypes: true })) {
      const child = rel ? path.join(rel, entry.name) : entry.name;
      if (entry.isDirectory()) await walk(child);
      else out.push(toPosix(child));
    }
  };
  await walk("");
  return out;
}

/**
 * Checks a backup folder without changing anything: the manifest against SHA256SUMS, then the size
 * and SHA-256 of the dump and every photo file, and that no file was added. Returns the manifest;
 * throws BackupDamagedError listing every problem found.
 */
export async function verifyBackup(dir: string): Promise<Manifest> {
  const problems: string[] = [];
  const read = async (name: string) => {
    try {
      return await readFile(path.join(dir, name));
    } catch {
      problems.push(`${name} is missing.`);
      return null;
    }
  };
  if (!(await exists(dir))) throw new BackupDamagedError([`${dir} does not exist.`]);
  const manifestBytes = await read(MANIFEST_FILE);
  const sumsBytes = await read(CHECKSUMS_FILE);
  if (!manifestBytes || !sumsBytes) throw new BackupDamagedError(problems);

  const sums = new Map<string, string>();
  for (const line of sumsBytes.toString("utf8").split("\n")) {
    const m = /^([0-9a-f]{64}) [ *](.+)$/.exec(line);
    if (m) sums.set(m[2]!, m[1]!);
    else if (line.trim()) problems.push(`${CHECKSUMS_FILE} has a line that is not "<sha256>  <file>": ${line.slice(0, 80)}`);
  }
  const manifestSum = createHash("sha256").update(manifestBytes).digest("hex");
  if (sums.get(MANIFEST_FILE) !== manifestSum)
    problems.push(`${MANIFEST_FILE} does not match its checksum in ${CHECKSUMS_FILE}.`);

  let manifest: Manifest;
  try {
    manifest = JSON.parse(manifestBytes.toString("utf8")) as Manifest;
  } catch {
    throw new BackupDamagedError([...problems, `${MANIFEST_FILE} is not valid JSON.`]);
  }
  if (manifest.format !== "dewline-backup" || manifest.formatVersion !== 1 || !manifest.database?.dump || !manifest.photos) {
    throw new BackupDamagedError([...problems, `${MANIFEST_FILE} is not a Dewline backup manifest (format 1).`]);
  }

  const listed = [manifest.database.dump, ...manifest.photos.files];
  const known = new Set<string>([MANIFEST_FILE, CHECKSUMS_FILE]);
  for (const entry of listed) {
    known.add(entry.path);
    if (entry.path.split("/").includes("..") || path.isAbsolute(entry.path)) {
      problems.push(`${entry.path}: a path outside the backup folder.`);
      continue;
    }
    if (sums.get(entry.path) !== entry.sha256)
      problems.push(`${entry.path}: its checksum differs between ${MANIFEST_FILE} and ${CHECKSUMS_FILE}.`);
    const file = path.join(dir, entry.path);
    let size: number;
    try {
      size = (await stat(file)).size;
    } catch {
      problems.push(`${entry.path} is missing.`);
      continue;
    }
    if (size !== entry.size) problems.push(`${entry.path}: ${size} bytes, the manifest says ${entry.size}.`);
    else if ((await sha256File(file)) !== entry.sha256)
      problems.push(`${entry.path}: its SHA-256 does not match (the file was changed or damaged).`);
  }
  for (const file of await listAll(dir)) {
    if (!known.has(file)) problems.push(`${file} is not listed in the manifest.`);
  }
  for (const name of sums.keys())
    if (!known.has(name)) problems.push(`${CHECKSUMS_FILE} lists ${name}, which the manifest does not.`);
  if (problems.length) throw new BackupDamagedError(problems);
  return manifest;
}

export interface RestoreOptions {
  dir: string;
  db: DbTarget;
  uploadsDir: string;
  /** With STORAGE_DRIVER=s3: the store the photos go into. */
  photoStore?: ObjectStore;
  /** Replace a database that already has tables and write over existing photo files. */
  force?: boolean;
}

export interface RestoreSummary {
  manifest: Manifest;
  tables: Record<string, number>;
  photos: { restored: number; alreadyPresent: number; bytes: number };
  /** Files in the photo store that are not in the backup (left in place). */
  extraPhotoFiles: number;
  /** Tables dropped first because of --force. */
  replacedTables: number;
}

/** Removes DEFINER clauses so triggers and routines belong to the restoring account (which may differ). */
const stripDefiner = (line: string) =>
  line
    .replace(/\/\*!50017 DEFINER=`(?:[^`]|``)*`@`(?:[^`]|``)*`\s*\*\/\s*/g, "")
    .replace(/DEFINER=`(?:[^`]|``)*`@`(?:[^`]|``)*`\s*/g, "");

/**
 * Verifies the backup (refusing a damaged one before touching anything), refuses a database that
 * already has tables or a photo store that already has photos unless `force`, loads the dump,
 * copies the photos, then checks row counts and file checksums against the manifest.
 */
export async function restoreBackup(opts: RestoreOptions): Promise<RestoreSummary> {
  const manifest = await verifyBackup(opts.dir);

  const conn = await connect(opts.db);
  try {
    const [objects] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT table_name AS name, table_type AS type FROM information_schema.tables WHERE table_schema = DATABASE()",
    );
    const photos = opts.photoStore ? storeSide(opts.photoStore) : folderSide(opts.uploadsDir);
    const photoFiles = await photos.list();
    if (!opts.force && (objects.length > 0 || photoFiles.length > 0)) {
      const what = [
        objects.length ? `the database ${opts.db.name} has ${objects.length} tables` : null,
        photoFiles.length ? `the photo store ${photos.name} has ${photoFiles.length} files` : null,
      ].filter(Boolean);
      throw new RestoreRefusedError(
        `Refusing to restore: ${what.join(" and ")}. Nothing was changed. ` +
          "Restore into an empty database and photo store, or add --force to replace that database's tables " +
          "and write over photo files of the same name (other photo files are left in place).",
      );
    }

    if (objects.length) {
      const views = objects.filter((o) => o.type === "VIEW").map((o) => quoteId(String(o.name)));
      const tables = objects.filter((o) => o.type !== "VIEW").map((o) => quoteId(String(o.name)));
      await conn.query(
        [
          "SET FOREIGN_KEY_CHECKS = 0",
          views.length ? `DROP VIEW IF EXISTS ${views.join(", ")}` : null,
          tables.length ? `DROP TABLE IF EXISTS ${tables.join(", ")}` : null,
          "SET FOREIGN_KEY_CHECKS = 1",
        ]
          .filter(Boolean)
          .join(";\n"),
      );
    }

    await withOptionFile(opts.db, async (optionFile) => {
      await runPiped(
        "mariadb",
        [`--defaults-file=${optionFile}`, "--default-character-set=utf8mb4", "--binary-mode", opts.db.name],
        (child) =>
          pipeline(createReadStream(path.join(opts.dir, DUMP_FILE)), createGunzip(), new DumpLines(stripDefiner), child.stdin!),
        "stdin",
      );
    });

    // Photos: each file written under a temporary name and renamed, so a half-written file never
    // sits under a photo's name.
    let restored = 0;
    let alreadyPresent = 0;
    let bytes = 0;
    for (const entry of manifest.photos.files) {
      const rel = entry.path.slice(PHOTOS_DIR.length + 1);
      if ((await photos.sha256(rel)) === entry.sha256) {
        alreadyPresent++;
        continue;
      }
      await photos.write(rel, path.join(opts.dir, entry.path));
      restored++;
      bytes += entry.size;
    }

    // Check what is now in place against the manifest.
    const problems: string[] = [];
    const [nowTables] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE'",
    );
    const tables: Record<string, number> = {};
    for (const t of nowTables) {
      const name = String(t.name);
      const [[row]] = await conn.query<mysql.RowDataPacket[]>(`SELECT COUNT(*) AS n FROM ${quoteId(name)}`);
      tables[name] = Number(row!.n);
    }
    for (const [name, expected] of Object.entries(manifest.database.tables)) {
      if (!(name in tables)) problems.push(`table ${name} is missing.`);
      else if (tables[name] !== expected) problems.push(`table ${name} has ${tables[name]} rows, the backup ${expected}.`);
    }
    for (const name of Object.keys(tables))
      if (!(name in manifest.database.tables)) problems.push(`table ${name} is not in the backup.`);
    for (const entry of manifest.photos.files) {
      if ((await photos.sha256(entry.path.slice(PHOTOS_DIR.length + 1))) !== entry.sha256)
        problems.push(`photo file ${entry.path} does not match the backup.`);
    }
    if ("photos" in tables) {
      const [rows] = await conn.query<mysql.RowDataPacket[]>("SELECT id, display_path, thumbnail_path FROM photos");
      for (const r of rows) {
        for (const rel of [String(r.display_path), String(r.thumbnail_path)]) {
          if (!(await photos.has(rel))) problems.push(`photo ${r.id}: its file ${rel} is not in the photo store.`);
        }
      }
    }
    if (problems.length) throw new RestoreMismatchError(problems);

    const known = new Set(manifest.photos.files.map((f) => f.path.slice(PHOTOS_DIR.length + 1)));
    const extraPhotoFiles = photoFiles.filter((f) => !known.has(toPosix(f))).length;
    return {
      manifest,
      tables,
      photos: { restored, alreadyPresent, bytes },
      extraPhotoFiles,
      replacedTables: objects.length,
    };
  } finally {
    await conn.end();
  }
}

/** A few lines for a person: what the backup holds. */
export function describeManifest(m: Manifest): string[] {
  const rows = Object.values(m.database.tables).reduce((a, b) => a + b, 0);
  const mb = (n: number) => (n < 1_048_576 ? `${Math.ceil(n / 1024)} kB` : `${(n / 1_048_576).toFixed(1)} MB`);
  return [
    `Taken ${m.createdAt} by ${m.app.name} ${m.app.version} from database ${m.database.name} (MariaDB ${m.database.serverVersion}).`,
    `Schema: ${m.database.migrations.length} migrations, last ${m.database.migrations.at(-1) ?? "none"}.`,
    `Database: ${Object.keys(m.database.tables).length} tables, ${rows} rows; dump ${mb(m.database.dump.size)} gzip (${mb(m.database.dump.uncompressedSize)} SQL).`,
    `Photos: ${m.photos.count} files, ${mb(m.photos.bytes)}.`,
  ];
}
