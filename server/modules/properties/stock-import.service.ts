// An admin's asset register into the landlord's homes: a preview that proposes which column feeds
// which field, and an import that upserts by (landlord, UPRN).
//
// - The file is streamed (CSV or .xlsx) and converted row by row (src/lib/domain/stock-register.ts).
// - Rows go to MariaDB in batches of BATCH_ROWS: one SELECT … FOR UPDATE of the homes already held
//   with those UPRNs (to say what changed), one INSERT … SELECT … FROM JSON_TABLE(?) for the new homes,
//   one UPDATE … JOIN JSON_TABLE(?) for the changed ones, and one INSERT for rooms not yet there.
//   Each batch travels as a single JSON parameter of a prepared statement (the readings import's way).
// - One transaction: the homes, the rooms and the import's record with its report commit together or
//   not at all, so a failure half-way, or the process dying, leaves nothing of the import.
// - A later row with a UPRN already seen in the file is refused, naming the first line; an empty cell
//   leaves what we hold (the register does not say), so a repeat import changes nothing.
import type { PoolConnection, ResultSetHeader, RowDataPacket } from "mysql2";
import type { DataSource } from "typeorm";
import { z } from "zod";
import {
  convertStockRow,
  missingEngineFields,
  missingStockFields,
  proposeStockMapping,
  STOCK_FIELDS,
  type StockHome,
  type StockMapping,
} from "../../../src/lib/domain/stock-register.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError, UnprocessableError, ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { parse } from "../../lib/validation.js";
import { readStockHead, stockRecordChunks, type StockFileHead } from "./stock-file.js";
import { StockImport } from "./stock-import.entity.js";

export const BATCH_ROWS = 5_000;

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

type Stored = Record<keyof StockHome, string | number | boolean | null>;

const jsonColumns = (withId: boolean) =>
  [
    ...(withId ? ["id INT UNSIGNED PATH '$[0]'"] : []),
    ...COLUMNS.map(([, col, type], i) => `${col} ${type} PATH '$[${i + (withId ? 1 : 0)}]'`),
  ].join(", ");

const INSERT_SQL =
  `INSERT INTO properties (organisation_id, ${COLUMNS.map(([, c]) => c).join(", ")}) ` +
  `SELECT ?, ${COLUMNS.map(([, c]) => `j.${c}`).join(", ")} FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (${jsonColumns(false)})) AS j`;

const UPDATE_SQL =
  `UPDATE properties p JOIN JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (${jsonColumns(true)})) AS j ON p.id = j.id ` +
  `SET ${COLUMNS.filter(([f]) => f !== "uprn")
    .map(([, c]) => `p.${c} = j.${c}`)
    .join(", ")} WHERE p.organisation_id = ?`;

const EXISTING_SQL =
  `SELECT p.id, ${COLUMNS.map(([f, c]) => `p.${c} AS ${f}`).join(", ")} FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (u VARCHAR(12) PATH '$')) AS j ` +
  "JOIN properties p ON p.organisation_id = ? AND p.uprn = j.u FOR UPDATE";

const ROOMS_SQL =
  "INSERT INTO rooms (property_id, name, kind) SELECT p.id, j.name, j.kind " +
  "FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (u VARCHAR(12) PATH '$[0]', name VARCHAR(100) PATH '$[1]', kind VARCHAR(20) PATH '$[2]')) AS j " +
  "JOIN properties p ON p.organisation_id = ? AND p.uprn = j.u";

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
  /** Test hook: called inside the transaction after each batch is stored; throwing aborts the import. */
  onBatch?: (rowsSoFar: number) => void | Promise<void>;
}

export interface StockImportPreview extends Omit<StockFileHead, "headerLine"> {
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
  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
    private readonly logger?: Logger,
    private readonly batchRows = BATCH_ROWS,
  ) {}

  async preview(filePath: string): Promise<StockImportPreview> {
    const head = await readStockHead(filePath);
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

  private resolveMapping(head: StockFileHead, override: unknown): StockMapping {
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
    const head = await readStockHead(input.filePath);
    const mapping = this.resolveMapping(head, input.mapping);
    const thisYear = this.clock.now().getUTCFullYear();
    const org = actor.organisationId;
    const started = Date.now();

    const saved = await this.dataSource.transaction(async (m) => {
      if (!m.queryRunner) throw new Error("the stock import must run in a transaction");
      const raw = (await m.queryRunner.connect()) as PoolConnection;
      const db = raw.promise();

      const report: string[] = ["line,uprn,outcome,changed,details"];
      const counts = { created: 0, updated: 0, unchanged: 0, refused: 0 };
      const firstLineOf = new Map<string, number>();
      type Pending = { line: number; home: StockHome; rooms: { name: string; kind: string }[]; notes: string[] };
      let batch: Pending[] = [];
      let rows = 0;
      const refuse = (line: number, uprn: string, reasons: string[]) => {
        counts.refused++;
        report.push(`${line},${csvCell(uprn)},refused,,${csvCell(reasons.join(" "))}`);
      };

      /** Stores one batch; at most one is in flight while the next is read and converted. */
      const store = async (pending: Pending[]) => {
        const [found] = await db.execute<RowDataPacket[]>(EXISTING_SQL, [JSON.stringify(pending.map((p) => p.home.uprn)), org]);
        const existing = new Map<string, { id: number; stored: Stored }>();
        for (const r of found) {
          const stored = {} as Stored;
          for (const [f] of COLUMNS) stored[f] = normalise(f, r[f]);
          existing.set(String(r.uprn), { id: Number(r.id), stored });
        }
        let roomsHeld = new Map<number, Set<string>>();
        const ids = [...existing.values()].map((e) => e.id);
        if (ids.length && pending.some((p) => p.rooms.length)) roomsHeld = await this.roomNames(db, ids);

        const inserts: unknown[][] = [];
        const updates: unknown[][] = [];
        const newRooms: [string, string, string][] = [];
        for (const p of pending) {
          const held = existing.get(p.home.uprn);
          const names = held ? (roomsHeld.get(held.id) ?? new Set<string>()) : new Set<string>();
          const addRooms = p.rooms.filter((r) => !names.has(r.name.toLowerCase()));
          const notes = p.notes.length ? csvCell(p.notes.join(" ")) : "";
          if (!held) {
            const lacking = missingEngineFields(p.home);
            if (lacking.length) {
              refuse(p.line, p.home.uprn, [`A new home needs its ${lacking.join(", ")}: the risk engine reads them.`]);
              continue;
            }
            inserts.push(COLUMNS.map(([f]) => (f === "ventilation" ? (p.home.ventilation ?? "not-recorded") : json(p.home[f]))));
            counts.created++;
            report.push(`${p.line},${p.home.uprn},created,,${notes}`);
          } else {
            const changed: string[] = [];
            const merged = { ...held.stored };
            for (const [f] of COLUMNS) {
              const to = normalise(f, p.home[f]);
              if (to === null || to === held.stored[f]) continue;
              changed.push(f);
              merged[f] = to;
            }
            if (changed.length) updates.push([held.id, ...COLUMNS.map(([f]) => json(merged[f]))]);
            if (addRooms.length) changed.push("rooms");
            if (changed.length) {
              counts.updated++;
              report.push(`${p.line},${p.home.uprn},updated,${changed.join(" ")},${notes}`);
            } else {
              counts.unchanged++;
              report.push(`${p.line},${p.home.uprn},unchanged,,${notes}`);
            }
          }
          for (const r of addRooms) newRooms.push([p.home.uprn, r.name, r.kind]);
        }
        if (inserts.length) await db.execute<ResultSetHeader>(INSERT_SQL, [org, JSON.stringify(inserts)]);
        if (updates.length) await db.execute<ResultSetHeader>(UPDATE_SQL, [JSON.stringify(updates), org]);
        if (newRooms.length) await db.execute<ResultSetHeader>(ROOMS_SQL, [JSON.stringify(newRooms), org]);
        await input.onBatch?.(rows);
      };
      let inFlight: Promise<void> | null = null;
      let failure: unknown = null;
      const flush = async () => {
        if (inFlight) await inFlight;
        if (failure) throw failure;
        if (batch.length === 0) return;
        const pending = batch;
        batch = [];
        inFlight = store(pending).catch((e: unknown) => {
          failure ??= e;
        });
      };

      let header = true;
      try {
        for await (const chunk of stockRecordChunks(input.filePath, head.format, head.delimiter)) {
          for (const record of chunk) {
            if (header) {
              header = false;
              continue;
            }
            rows++;
            const row = convertStockRow(record.cells, mapping, head.headers, thisYear);
            if (!row.ok) {
              refuse(record.line, row.uprn, row.reasons);
              continue;
            }
            const first = firstLineOf.get(row.home.uprn);
            if (first !== undefined) {
              refuse(record.line, row.home.uprn, [`UPRN ${row.home.uprn} is already on line ${first} of this file.`]);
              continue;
            }
            firstLineOf.set(row.home.uprn, record.line);
            batch.push({ line: record.line, home: row.home, rooms: row.rooms, notes: row.notes });
            if (batch.length >= this.batchRows) await flush();
          }
        }
        await flush();
        await flush(); // waits for the last batch
      } finally {
        // A batch in flight finishes before the transaction rolls back.
        if (inFlight) await inFlight;
      }
      if (rows === 0) throw new UnprocessableError("The file has a header but no homes under it.");

      // The report is in file order: batches are flushed in order, but refusals are written as they come.
      const body = report.slice(1).sort((a, b) => parseInt(a, 10) - parseInt(b, 10));
      const repo = m.getRepository(StockImport);
      return repo.save(
        repo.create({
          organisationId: org,
          uploadedById: actor.id,
          fileName: displayFileName(input.fileName),
          ...counts,
          report: `${report[0]}\n${body.join("\n")}\n`,
          createdAt: this.clock.now(),
        }),
      );
    });
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
