// An admin's asset register into the landlord's homes: a preview that proposes which column feeds
// which field, and an import that upserts by (landlord, UPRN).
//
// - The file is streamed (CSV or .xlsx, server/lib/table-file.ts) and converted row by row
//   (src/lib/domain/stock-register.ts).
// - One import of a landlord at a time (a named lock), one transaction: the homes, the rooms and the
//   import's record with its report commit together or not at all, so a failure half-way, or the
//   process dying, leaves nothing of the import.
// - The landlord's homes are read once, streamed, into a compact map (UPRN → id and the stored fields
//   as one string) to say what each row changes. New homes go to MariaDB through LOAD DATA LOCAL
//   INFILE fed by a stream written as the file is parsed, so parsing (Node) and inserting (MariaDB)
//   overlap (one statement per LOAD_SEGMENT_ROWS homes); only that stream can be sent, never a file the server names. LOAD DATA LOCAL turns a
//   duplicate key or a bad value into a warning: unless every row sent was stored without one, the
//   import fails and leaves nothing. Changed homes (UPDATE … JOIN JSON_TABLE, only the changed
//   fields) and rooms follow in batches.
// - A later row with a UPRN already seen in the file is refused, naming the first line; an empty cell
//   leaves what we hold (the register does not say), so a repeat import changes nothing.
import { once } from "node:events";
import { PassThrough, type Writable } from "node:stream";
import type { PoolConnection, ResultSetHeader, RowDataPacket } from "mysql2";
import type { DataSource } from "typeorm";
import { z } from "zod";
import {
  missingEngineFields,
  missingStockFields,
  proposeStockMapping,
  STOCK_FIELDS,
  stockRowConverter,
  type StockHome,
  type StockMapping,
} from "../../../src/lib/domain/stock-register.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, NotFoundError, UnprocessableError, ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { readTableHead, tableRowChunks, type TableHead } from "../../lib/table-file.js";
import { parse } from "../../lib/validation.js";
import { StockImport } from "./stock-import.entity.js";
import { beginHookedTransaction } from "../../lib/transaction.js";
import { HomeSearchService, idRanges, type IdRange } from "./home-search.service.js";

export const BATCH_ROWS = 5_000;
/** How long an import waits for another import of the same landlord to finish. */
const LOCK_WAIT_SECONDS = 30;
const ER_DUP_ENTRY = 1062;

/** The home's fields as stored: the JSON_TABLE column type of each, in the order of the JSON rows. */
const COLUMNS = [
  ["uprn", "uprn", "VARCHAR(12)"],
  ["addressLine1", "address_line1", "VARCHAR(190)"],
  ["addressLine2", "address_line2", "VARCHAR(190)"],
  ["town", "town", "VARCHAR(100)"],
  ["postcode", "postcode", "VARCHAR(10)"],
  ["estate", "estate", "VARCHAR(100)"],
  ["block", "block", "VARCHAR(100)"],
  ["builtForm", "built_form", "VARCHAR(20)"],
  ["wallType", "wall_type", "VARCHAR(20)"],
  ["glazingType", "glazing_type", "VARCHAR(20)"],
  ["heatingType", "heating_type", "VARCHAR(20)"],
  ["ventilation", "ventilation", "VARCHAR(30)"],
  ["builtYear", "built_year", "SMALLINT UNSIGNED"],
  ["ageBand", "age_band", "VARCHAR(20)"],
  ["wallInsulation", "wall_insulation", "VARCHAR(20)"],
  ["roofInsulationMm", "roof_insulation_mm", "SMALLINT UNSIGNED"],
  ["heatingFuel", "heating_fuel", "VARCHAR(20)"],
  ["hasExtractFans", "has_extract_fans", "TINYINT"],
  ["hasTrickleVents", "has_trickle_vents", "TINYINT"],
  ["floorAreaM2", "floor_area_m2", "DECIMAL(6,1)"],
  ["epcBand", "epc_band", "CHAR(1)"],
] as const satisfies readonly (readonly [keyof StockHome, string, string])[];

type Room = { name: string; kind: string };

const jsonColumns = (withId: boolean) =>
  [
    ...(withId ? ["id INT UNSIGNED PATH '$[0]'"] : []),
    ...COLUMNS.map(([, col, type], i) => `${col} ${type} PATH '$[${i + (withId ? 1 : 0)}]'`),
  ].join(", ");

/** LOAD DATA's file name: never opened, the statement's per-query stream factory ignores it. */
const LOAD_SQL =
  "LOAD DATA LOCAL INFILE 'stock-register-stream' INTO TABLE properties CHARACTER SET utf8mb4 " +
  "FIELDS TERMINATED BY '\\t' ESCAPED BY '\\\\' LINES TERMINATED BY '\\n' " +
  `(${COLUMNS.map(([, c]) => c).join(", ")}) SET organisation_id = ?`;

/** Only the changed fields are sent (the others null), so an edit made meanwhile to another field stays. */
const UPDATE_SQL =
  `UPDATE properties p JOIN JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (${jsonColumns(true)})) AS j ON p.id = j.id ` +
  `SET ${COLUMNS.filter(([f]) => f !== "uprn")
    .map(([, c]) => `p.${c} = COALESCE(j.${c}, p.${c})`)
    .join(", ")} WHERE p.organisation_id = ?`;

const HELD_SQL = `SELECT id, ${COLUMNS.map(([, c]) => c).join(", ")} FROM properties WHERE organisation_id = ? AND uprn IS NOT NULL`;

const ROOMS_SQL =
  "INSERT INTO rooms (property_id, name, kind) SELECT p.id, j.name, j.kind " +
  "FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (u VARCHAR(12) PATH '$[0]', name VARCHAR(100) PATH '$[1]', kind VARCHAR(20) PATH '$[2]')) AS j " +
  "JOIN properties p ON p.organisation_id = ? AND p.uprn = j.u";

/** Separates the fields of a held home in the map; a value holding it is compared with it replaced. */
const FS = "\x1f";
const NULL_MARK = "\x00";
const TSV_SPECIAL = /[\\\t\n\r\0]/;
const TSV_ESCAPES: Record<string, string> = { "\\": "\\\\", "\t": "\\t", "\n": "\\n", "\r": "\\r", "\0": "\\0" };
/** Bytes of TSV gathered before they are handed to the connection. */
const TSV_CHUNK_BYTES = 64 * 1024;
/**
 * Room kept for one more row: the free-text fields are at most 680 characters (the lengths the
 * conversion checks), at most 3 bytes each in UTF-8 (an escaped character is 2 ASCII bytes), and the
 * other fields are short words and numbers.
 */
const TSV_ROW_ROOM = 8 * 1024;
/** The fields that hold a person's free text, so may need escaping; the others are words of ours, numbers or checked codes. */
const FREE_TEXT = new Set<keyof StockHome>(["addressLine1", "addressLine2", "town", "estate", "block"]);
/** Bytes the connection may hold unsent before the parser waits for MariaDB. */
const SOCKET_HIGH_WATER = 4 * 1024 * 1024;

/** New homes per LOAD DATA statement. */
const LOAD_SEGMENT_ROWS = 100_000;

/** One LOAD DATA LOCAL statement and the stream it reads (its own stream: the statement's factory ignores the name). */
class LoadSegment {
  private readonly tsv = new PassThrough();
  private settled = false;
  private readonly result: Promise<ResultSetHeader>;
  private readonly ended: Promise<void>;
  /** Rows written to the stream. */
  sent = 0;

  constructor(db: ReturnType<PoolConnection["promise"]>, org: number) {
    this.result = db
      .query<ResultSetHeader>({ sql: LOAD_SQL, values: [org], infileStreamFactory: () => this.tsv })
      .then(([r]) => r)
      .finally(() => {
        this.settled = true;
      });
    this.ended = this.result.then(
      () => undefined,
      () => undefined,
    );
  }

  /** Writes rows of TSV; waits while the connection holds more than SOCKET_HIGH_WATER bytes unsent. */
  async write(bytes: Buffer, rows: number, socket: Writable): Promise<void> {
    this.tsv.write(bytes);
    this.sent += rows;
    if (socket.writableLength > SOCKET_HIGH_WATER && !this.settled) await Promise.race([once(socket, "drain"), this.ended]);
    if (this.settled) {
      await this.result; // the statement failed: its error
      throw new Error("LOAD DATA ended before its stream did.");
    }
  }

  /** Ends the stream; the statement's result. */
  finish(): Promise<ResultSetHeader> {
    this.tsv.end();
    return this.result;
  }

  /** Ends the stream after a failure and waits for the statement, whatever its outcome. */
  async abandon(): Promise<void> {
    this.tsv.end();
    await this.ended;
  }
}

/**
 * New homes as LOAD DATA rows, written straight into a buffer (no string is built per row): \N for NULL,
 * flags as 1/0, and in free text the escape character, tabs and line breaks escaped.
 */
class TsvRows {
  private buf = Buffer.allocUnsafe(TSV_CHUNK_BYTES + TSV_ROW_ROOM);
  private at = 0;
  rows = 0;

  get full(): boolean {
    return this.at >= TSV_CHUNK_BYTES;
  }

  /** One home as a row; call only while not `full` (the room for a row is then there). */
  add(home: StockHome): void {
    if (this.full) throw new Error("TsvRows.add on a full buffer: take() it first.");
    const buf = this.buf;
    let at = this.at;
    for (let i = 0; i < COLUMNS.length; i++) {
      if (i) buf[at++] = 0x09; // tab
      const f = COLUMNS[i][0];
      const value = f === "ventilation" ? (home.ventilation ?? "not-recorded") : home[f];
      if (value === null || value === undefined) {
        buf[at++] = 0x5c; // \
        buf[at++] = 0x4e; // N
      } else if (value === true) buf[at++] = 0x31;
      else if (value === false) buf[at++] = 0x30;
      else {
        const text = typeof value === "string" ? value : String(value);
        at += buf.write(
          FREE_TEXT.has(f) && TSV_SPECIAL.test(text) ? text.replace(/[\\\t\n\r\0]/g, (c) => TSV_ESCAPES[c]!) : text,
          at,
        );
      }
    }
    buf[at++] = 0x0a; // newline
    this.at = at;
    this.rows++;
  }

  /** The rows written so far; the next rows go to a new buffer. */
  take(): Buffer {
    const out = this.buf.subarray(0, this.at);
    this.buf = Buffer.allocUnsafe(TSV_CHUNK_BYTES + TSV_ROW_ROOM);
    this.at = 0;
    this.rows = 0;
    return out;
  }
}

/** A normalised value as one field of the held homes' map. */
function canonical(value: string | number | boolean | null): string {
  if (value === null) return NULL_MARK;
  const s = String(value);
  return s.includes(FS) ? s.replaceAll(FS, "\ufffd") : s;
}

/** A stored value in the shape the import compares: numbers as numbers, flags as booleans. */
function normalise(field: keyof StockHome, value: unknown): string | number | boolean | null {
  if (value === null || value === undefined) return null;
  if (field === "hasExtractFans" || field === "hasTrickleVents") return Boolean(Number(value));
  if (field === "floorAreaM2" || field === "builtYear" || field === "roofInsulationMm") return Number(value);
  return String(value);
}

/** A report cell: quoted when needed, and a leading = + - @ neutralised so a spreadsheet shows it as text. */
export function csvCell(value: string | number): string {
  let s = String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

const column = z.number({ error: "must be a column number (0 is the first)." }).int().min(0);
const mappingSchema = z.partialRecord(z.enum(STOCK_FIELDS), column.nullable());

export interface StockImportInput {
  filePath: string;
  /** The browser's name for the file: display only, never a path. */
  fileName: string;
  /** Corrections to the proposed mapping: a column number, or null to leave a field out. */
  mapping?: unknown;
  /** Test hook: called inside the transaction after each `batchRows` rows are read; throwing aborts the import. */
  onBatch?: (rowsSoFar: number) => void | Promise<void>;
  /** Test hook: called inside the transaction once the landlord's homes are read, before any is written. */
  afterSnapshot?: () => void | Promise<void>;
}

export interface StockImportPreview extends Omit<TableHead, "headerLine"> {
  mapping: StockMapping;
  fields: (typeof STOCK_FIELDS)[number][];
  missing: string[];
}

function displayFileName(name: string): string {
  const base = (name.split(/[/\\]/).pop() ?? "").replace(/\p{Cc}/gu, "").trim();
  return Array.from(base || "register.csv")
    .slice(0, 255)
    .join("");
}

export class StockImportService {
  private readonly homeSearch: HomeSearchService;

  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly logger?: Logger,
    private readonly batchRows = BATCH_ROWS,
    private readonly loadSegmentRows = LOAD_SEGMENT_ROWS,
  ) {
    this.homeSearch = new HomeSearchService(dataSource, logger);
  }

  async preview(filePath: string): Promise<StockImportPreview> {
    const head = await readTableHead(filePath);
    const mapping = proposeStockMapping(head.headers);
    return {
      format: head.format,
      delimiter: head.delimiter,
      headers: head.headers,
      sampleRows: head.sampleRows,
      mapping,
      fields: [...STOCK_FIELDS],
      missing: missingStockFields(mapping),
    };
  }

  private resolveMapping(head: TableHead, override: unknown): StockMapping {
    const mapping: StockMapping = proposeStockMapping(head.headers);
    if (override !== undefined && override !== null && override !== "") {
      let value = override;
      if (typeof value === "string") {
        try {
          value = JSON.parse(value);
        } catch {
          throw new ValidationError('mapping: must be JSON, e.g. {"uprn": 0}.', [{ field: "mapping", message: "Must be JSON." }]);
        }
      }
      const given = parse(z.object({ mapping: mappingSchema }), { mapping: value }).mapping;
      for (const [field, col] of Object.entries(given) as [keyof StockMapping, number | null][]) {
        if (col === null) delete mapping[field];
        else mapping[field] = col;
      }
      // A merged address is used only without a first-line column; the admin's choice of either decides.
      if (given.address !== undefined && given.address !== null && given.addressLine1 === undefined) delete mapping.addressLine1;
    }
    const details: { field: string; message: string }[] = [];
    const used = new Map<number, string>();
    for (const [field, col] of Object.entries(mapping) as [string, number][]) {
      if (col >= head.headers.length)
        details.push({
          field: `mapping.${field}`,
          message: `Column ${col} is not in the file: it has ${head.headers.length} columns, numbered from 0.`,
        });
      const other = used.get(col);
      if (other !== undefined) details.push({ field: `mapping.${field}`, message: `Column ${col} already feeds ${other}.` });
      used.set(col, field);
    }
    if (details.length) throw new ValidationError(`${details[0].field}: ${details[0].message}`, details);
    const missing = missingStockFields(mapping);
    if (missing.length) throw new UnprocessableError(`Choose ${missing.join(" and ")} before importing.`, missing);
    return mapping;
  }

  /** Imports the register for the actor's landlord; see the top of this file for the rules. */
  async import(actor: Actor, input: StockImportInput): Promise<StockImport> {
    const head = await readTableHead(input.filePath);
    const mapping = this.resolveMapping(head, input.mapping);
    const org = actor.organisationId;
    const started = Date.now();

    const runner = this.dataSource.createQueryRunner();
    const raw = (await runner.connect()) as PoolConnection;
    const db = raw.promise();
    const lockName = `dewline.stock-import.${org}`;
    let saved: StockImport;
    try {
      const [[lock]] = await db.query<RowDataPacket[]>("SELECT GET_LOCK(?, ?) AS got", [lockName, LOCK_WAIT_SECONDS]);
      if (Number(lock?.got) !== 1)
        throw new ConflictError("Another import of your homes is still running: try again when it has finished.");
      try {
        await runner.startTransaction();
        let settle = (_committed: boolean) => undefined as void;
        try {
          // The request's Idempotency-Key commits with the import, or not at all.
          settle = await beginHookedTransaction(runner.manager);
          // The homes written go to the search's backlog in this transaction instead of each firing
          // the search triggers (HomeSearchService.bulkWrite: 23 s instead of 1.5 s for 100 000 homes).
          const before = await db.query<RowDataPacket[]>("SELECT COALESCE(MAX(id), 0) AS id FROM properties");
          const imported = await this.homeSearch.bulkWrite(
            (sql, params) => db.query(sql, params),
            org,
            async () => {
              const result = await this.importRows(raw, head, mapping, org, input);
              return {
                result,
                wrote: () => this.writtenHomes(db, Number(before[0][0]?.id ?? 0), result.created, result.updatedIds),
              };
            },
          );
          const { created, updated, unchanged, refused, report } = imported;
          const counts = { created, updated, unchanged, refused, report };
          const record = runner.manager.getRepository(StockImport).create({
            organisationId: org,
            uploadedById: actor.id,
            fileName: displayFileName(input.fileName),
            ...counts,
            createdAt: this.clock.now(),
          });
          // A prepared statement sends the report (megabytes at 100 000 rows) as it is, where the
          // repository's save escaped it into the SQL text first.
          const [inserted] = await db.execute<ResultSetHeader>(
            "INSERT INTO stock_imports (organisation_id, uploaded_by_id, file_name, created, updated, unchanged, refused, report, created_at) " +
              "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)",
            [
              org,
              actor.id,
              record.fileName,
              counts.created,
              counts.updated,
              counts.unchanged,
              counts.refused,
              counts.report,
              record.createdAt,
            ],
          );
          record.id = inserted.insertId;
          saved = record;
          await runner.commitTransaction();
          settle(true);
        } catch (e) {
          await runner.rollbackTransaction();
          settle(false);
          throw e;
        }
      } finally {
        // A connection that broke has lost its lock with it: nothing to release, and the first error stands.
        await db.query("DO RELEASE_LOCK(?)", [lockName]).catch(() => undefined);
      }
    } finally {
      await runner.release();
    }
    this.logger?.info(
      {
        audit: "stock-imported",
        actorId: actor.id,
        organisationId: org,
        importId: saved.id,
        created: saved.created,
        updated: saved.updated,
        unchanged: saved.unchanged,
        refused: saved.refused,
        ms: Date.now() - started,
      },
      "audit: stock-imported",
    );
    return saved;
  }

  /** The landlord's homes with a UPRN, read as a stream: UPRN → "id FS field FS field …" (normalised). */
  private async heldHomes(raw: PoolConnection, org: number): Promise<Map<string, string>> {
    const held = new Map<string, string>();
    const rows = raw.query({ sql: HELD_SQL, values: [org], rowsAsArray: true }).stream({ highWaterMark: 1_000 });
    const fields = new Array<string>(COLUMNS.length + 1);
    for await (const r of rows as AsyncIterable<unknown[]>) {
      fields[0] = String(r[0]);
      for (let i = 0; i < COLUMNS.length; i++) fields[i + 1] = canonical(normalise(COLUMNS[i][0], r[i + 1]));
      // join() makes one flat string: built with +=, each would be a tree of 40-odd pieces.
      held.set(String(r[1]), fields.join(FS));
    }
    return held;
  }

  /**
   * Reads, converts and stores every row inside the caller's transaction (on `raw`); the counts and
   * the report of the import.
   */
  private async importRows(
    raw: PoolConnection,
    head: TableHead,
    mapping: StockMapping,
    org: number,
    input: StockImportInput,
  ): Promise<{ created: number; updated: number; unchanged: number; refused: number; report: string; updatedIds: number[] }> {
    const db = raw.promise();
    const convert = stockRowConverter(mapping, head.headers, this.clock.now().getUTCFullYear());
    const held = await this.heldHomes(raw, org);
    await input.afterSnapshot?.();

    const report: string[] = [];
    const counts = { created: 0, updated: 0, unchanged: 0, refused: 0 };
    const firstLineOf = new Map<string, number>();
    const refuse = (line: number, uprn: string, reasons: string[]) => {
      counts.refused++;
      report.push(`${line},${csvCell(uprn)},refused,,${csvCell(reasons.join(" "))}`);
    };
    // Held homes whose rows name rooms: their report line waits for the rooms we hold.
    type Waiting = { at: number; line: number; uprn: string; id: number; changed: string[]; rooms: Room[]; notes: string };
    const waiting: Waiting[] = [];
    const newRooms: [string, string, string][] = [];
    const updates: unknown[][] = [];

    // New homes: a LOAD DATA statement reads what is written while the file is parsed; one statement per
    // LOAD_SEGMENT_ROWS homes, so none runs long enough for the database watch to call it stalled.
    const socket = (raw as unknown as { stream: Writable }).stream;
    let segment: LoadSegment | null = null;
    const pending = new TsvRows();
    const finish = async (done: LoadSegment) => {
      const loaded = await done.finish();
      if (loaded.affectedRows !== done.sent || loaded.warningStatus !== 0) await this.loadFailed(db, done.sent, loaded);
    };
    const sentInSegment = () => segment?.sent ?? 0;
    const send = async () => {
      segment ??= new LoadSegment(db, org);
      const rowsSent = pending.rows;
      await segment.write(pending.take(), rowsSent, socket);
      if (segment.sent >= this.loadSegmentRows) {
        const done = segment;
        segment = null;
        await finish(done);
      }
    };

    let rows = 0;
    let sinceBatch = 0;
    try {
      for await (const chunk of tableRowChunks(input.filePath, head)) {
        for (const record of chunk) {
          rows++;
          const row = convert(record.cells);
          if (!row.ok) {
            refuse(record.line, row.uprn, row.reasons);
          } else {
            const { home, rooms } = row;
            const first = firstLineOf.get(home.uprn);
            if (first !== undefined) {
              refuse(record.line, home.uprn, [`UPRN ${home.uprn} is already on line ${first} of this file.`]);
            } else {
              firstLineOf.set(home.uprn, record.line);
              const notes = row.notes.length ? csvCell(row.notes.join(" ")) : "";
              const stored = held.get(home.uprn);
              if (stored === undefined) {
                const lacking = missingEngineFields(home);
                if (lacking.length) {
                  refuse(record.line, home.uprn, [`A new home needs its ${lacking.join(", ")}: the risk engine reads them.`]);
                } else {
                  pending.add(home);
                  counts.created++;
                  report.push(`${record.line},${home.uprn},created,,${notes}`);
                  for (const r of rooms) newRooms.push([home.uprn, r.name, r.kind]);
                }
              } else {
                const fields = stored.split(FS);
                const id = Number(fields[0]);
                const changed: string[] = [];
                let update: unknown[] | null = null;
                for (let i = 0; i < COLUMNS.length; i++) {
                  const f = COLUMNS[i][0];
                  const to = normalise(f, home[f]);
                  if (to === null || canonical(to) === fields[i + 1]) continue;
                  changed.push(f);
                  update ??= [id, ...COLUMNS.map(() => null)];
                  update[i + 1] = json(to);
                }
                if (update) updates.push(update);
                if (rooms.length) {
                  waiting.push({ at: report.push("") - 1, line: record.line, uprn: home.uprn, id, changed, rooms, notes });
                } else if (changed.length) {
                  counts.updated++;
                  report.push(`${record.line},${home.uprn},updated,${changed.join(" ")},${notes}`);
                } else {
                  counts.unchanged++;
                  report.push(`${record.line},${home.uprn},unchanged,,${notes}`);
                }
              }
            }
          }
          if (++sinceBatch >= this.batchRows) {
            sinceBatch = 0;
            await input.onBatch?.(rows);
          }
          if (pending.full || sentInSegment() + pending.rows >= this.loadSegmentRows) await send();
        }
      }
      if (pending.rows) await send();
      if (segment) {
        const done = segment;
        segment = null;
        await finish(done);
      }
    } finally {
      // On a failure the statement still ends with what it was sent, and the rollback takes that back.
      if (segment) await (segment as LoadSegment).abandon();
    }
    if (rows === 0) throw new UnprocessableError("The file has a header but no homes under it.");

    for (let i = 0; i < updates.length; i += BATCH_ROWS) {
      await db.execute<ResultSetHeader>(UPDATE_SQL, [JSON.stringify(updates.slice(i, i + BATCH_ROWS)), org]);
    }
    for (let i = 0; i < waiting.length; i += BATCH_ROWS) {
      const part = waiting.slice(i, i + BATCH_ROWS);
      const roomsHeld = await this.roomNames(
        db,
        part.map((w) => w.id),
      );
      for (const w of part) {
        const names = roomsHeld.get(w.id) ?? new Set<string>();
        const add = w.rooms.filter((r) => !names.has(r.name.toLowerCase()));
        if (add.length) w.changed.push("rooms");
        for (const r of add) newRooms.push([w.uprn, r.name, r.kind]);
        if (w.changed.length) {
          counts.updated++;
          report[w.at] = `${w.line},${w.uprn},updated,${w.changed.join(" ")},${w.notes}`;
        } else {
          counts.unchanged++;
          report[w.at] = `${w.line},${w.uprn},unchanged,,${w.notes}`;
        }
      }
    }
    for (let i = 0; i < newRooms.length; i += BATCH_ROWS) {
      await db.execute<ResultSetHeader>(ROOMS_SQL, [JSON.stringify(newRooms.slice(i, i + BATCH_ROWS)), org]);
    }
    return {
      ...counts,
      report: `line,uprn,outcome,changed,details\n${report.join("\n")}\n`,
      updatedIds: updates.map((u) => Number(u[0])),
    };
  }

  /**
   * The homes an import wrote, for the search's backlog: the updated ones, and the new ones as one run from
   * just above the highest id before the import to the highest id it sees now (its own rows are the newest
   * it sees). Other landlords' homes inside the run are passed over by the search and its catch-up. Both
   * ends are read from the end of the primary key: asking for this landlord's lowest and highest new id
   * read every new home again (1.1 s of a 13 s import of 100 000 homes on a busy machine, bench:stock).
   */
  private async writtenHomes(
    db: ReturnType<PoolConnection["promise"]>,
    highestBefore: number,
    created: number,
    updatedIds: readonly number[],
  ): Promise<IdRange[]> {
    const ranges = idRanges(updatedIds);
    if (created > 0) {
      const [[highest]] = await db.query<RowDataPacket[]>("SELECT MAX(id) AS id FROM properties");
      ranges.push({ first: highestBefore + 1, last: Number(highest?.id) });
    }
    return ranges;
  }

  /** LOAD DATA LOCAL skipped or altered rows (a duplicate UPRN, a value a column refused): fail the import. */
  private async loadFailed(db: ReturnType<PoolConnection["promise"]>, sent: number, loaded: ResultSetHeader): Promise<never> {
    const [warnings] = await db.query<RowDataPacket[]>("SHOW WARNINGS LIMIT 3");
    if (warnings.some((w) => Number(w.Code) === ER_DUP_ENTRY)) {
      throw new ConflictError(
        "Homes with UPRNs in this file were added while the import ran, so nothing was imported. Import the file again.",
      );
    }
    const text = warnings.map((w) => String(w.Message)).join("; ");
    throw new Error(
      `LOAD DATA stored ${loaded.affectedRows} of ${sent} new homes with ${loaded.warningStatus} warnings: ${text}`,
    );
  }

  private async roomNames(db: ReturnType<PoolConnection["promise"]>, ids: number[]): Promise<Map<number, Set<string>>> {
    const [rows] = await db.query<RowDataPacket[]>("SELECT property_id, name FROM rooms WHERE property_id IN (?)", [ids]);
    const out = new Map<number, Set<string>>();
    for (const r of rows) {
      const set = out.get(Number(r.property_id)) ?? new Set<string>();
      set.add(String(r.name).toLowerCase());
      out.set(Number(r.property_id), set);
    }
    return out;
  }

  /** The landlord's imports, newest first. */
  async list(actor: Actor): Promise<StockImport[]> {
    return this.dataSource.getRepository(StockImport).find({
      where: { organisationId: actor.organisationId },
      order: { createdAt: "DESC", id: "DESC" },
      take: 50,
      select: { id: true, fileName: true, created: true, updated: true, unchanged: true, refused: true, createdAt: true },
    });
  }

  /** One import of the actor's landlord; 404 for anything else. */
  async get(actor: Actor, id: number, withReport = false): Promise<StockImport> {
    const found = await this.dataSource.getRepository(StockImport).findOne({
      where: { id, organisationId: actor.organisationId },
      select: {
        id: true,
        fileName: true,
        created: true,
        updated: true,
        unchanged: true,
        refused: true,
        createdAt: true,
        report: withReport,
      },
    });
    if (!found) throw new NotFoundError("No such import.");
    return found;
  }
}

/** A value for the JSON rows: flags as 1/0 for TINYINT columns. */
function json(value: unknown): unknown {
  if (value === true) return 1;
  if (value === false) return 0;
  return value ?? null;
}
