// Logger CSV files into a case's readings: a preview that proposes how to read the file, and an
// import that streams it into the database in one transaction.
//
// - The file is never read whole: the preview reads the first 64 KB; the import streams it
//   through a UTF-8 check and csv-parse, and sends multi-row INSERT IGNORE batches of
//   BATCH_ROWS, parsing the next batch while the database stores the last one.
// - One transaction: the ReadingImport row, every batch and the final counts commit together or
//   not at all (an exception, a bad byte late in the file, or the process dying leaves nothing).
// - A row already stored for the same case, room and second (or earlier in the same file) is a
//   duplicate: skipped and counted, not an error.
// - Row numbers in the report are the file's 1-based line numbers, the header counted.
import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import { Transform, pipeline } from "node:stream";
import { parse as parseCsv, CsvError } from "csv-parse";
import type { PoolConnection, ResultSetHeader } from "mysql2";
import type { DataSource, EntityManager } from "typeorm";
import { z } from "zod";
import { NotFoundError, UnprocessableError, ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import type { CaseEventRecorder } from "./reading.service.js";
import { DATE_FORMATS, detectDateFormat } from "./csv/dates.js";
import type { Delimiter } from "./csv/delimiter.js";
import { Utf8StreamCheck, checkHead, notUtf8Message } from "./csv/encoding.js";
import { csvOptions, detectLayout, type Layout } from "./csv/layout.js";
import {
  COLUMN_ROLES,
  proposeMapping,
  temperatureUnitOf,
  type Mapping,
  type MappingOverride,
  type MappingProposal,
} from "./csv/mapping.js";
import { RejectedReport } from "./csv/report.js";
import { createRowConverter, emptyRow, isBlankRecord, type ConvertedRow } from "./csv/rows.js";
import { isTimeZone } from "../../../src/lib/domain/time-zone.js";
import { ReadingImport } from "./reading-import.entity.js";
import type { Clock } from "../../lib/clock.js";

export type { Mapping, MappingOverride } from "./csv/mapping.js";

/** Bytes the preview (and the import's detection) reads from the start of the file. */
export const HEAD_BYTES = 64 * 1024;
/**
 * Rows per INSERT. Larger batches cut the per-statement cost but keep more in memory; 5 000 was
 * as fast as 10 000–20 000 in scripts/bench-import.ts once batches were pipelined. A batch is
 * at most ~250 KB of JSON, far below MariaDB's default 16 MB max_allowed_packet.
 */
export const BATCH_ROWS = 5_000;

export interface ImportPreview {
  delimiter: Delimiter;
  /** Numbers use a decimal comma (semicolon- or tab-delimited files). */
  decimalComma: boolean;
  hasHeader: boolean;
  headers: string[];
  mapping: Mapping;
  /** The first 10 data rows, as written. */
  sampleRows: string[][];
  /** Things the user should check before importing, in plain words. */
  problems: string[];
}

export interface ImportInput {
  caseId: number;
  roomId: number;
  actorId: number;
  filePath: string;
  /** The browser's name for the file: kept for display only, never used as a path. */
  fileName: string;
  /** Overrides for the proposed mapping (null removes an optional column). */
  mapping?: MappingOverride;
  /**
   * Test hook: called after each batch has been stored (inside the transaction, not yet
   * committed) with the number of rows sent so far. Throwing from it aborts the import, which is
   * how the tests show that a failure mid-way leaves nothing behind.
   */
  onBatch?: (rowsSoFar: number) => void;
}

export interface ImportResult {
  importId: number;
  imported: number;
  duplicates: number;
  rejected: number;
  rejectedReportUrl?: string;
}

interface Inspection {
  layout: Layout;
  proposal: MappingProposal;
  problems: string[];
}

const columnIndex = z
  .number({ error: "must be a column number (0 is the first column)." })
  .int("must be a whole number.")
  .min(0, "must be 0 or more.");
const overrideSchema = z.object({
  mapping: z
    .object({
      timestamp: columnIndex.optional(),
      timeOfDay: columnIndex.nullable().optional(),
      temperature: columnIndex.optional(),
      humidity: columnIndex.optional(),
      surfaceTemperature: columnIndex.nullable().optional(),
      outdoorTemperature: columnIndex.nullable().optional(),
      temperatureUnit: z.enum(["C", "F"], { error: "must be C or F." }).optional(),
      dateFormat: z.enum(DATE_FORMATS, { error: `must be one of ${DATE_FORMATS.join(", ")}.` }).optional(),
      timeZone: z
        .string({ error: "must be a time zone name such as Europe/London." })
        .refine(isTimeZone, "must be a time zone name such as Europe/London.")
        .optional(),
    })
    .strict(),
});

/**
 * One batch is one multi-row INSERT IGNORE with parameters: the readings travel as a single JSON
 * array parameter of [takenAt, air, rh(, surface, outdoor)] rows, which MariaDB's JSON_TABLE
 * (10.6+) turns back into rows. The server then parses one string instead of tens of thousands
 * of literals, which made a batch about 1.5× faster than INSERT … VALUES (?,…),(…) in
 * scripts/bench-import.ts. Optional columns the mapping does not have are left out of the JSON.
 */
function insertBatchSql(surface: boolean, outdoor: boolean): string {
  const columns = ["taken_at DATETIME PATH '$[0]'", "air DECIMAL(5,2) PATH '$[1]'", "rh DECIMAL(5,2) PATH '$[2]'"];
  if (surface) columns.push(`surface DECIMAL(5,2) PATH '$[${columns.length}]'`);
  if (outdoor) columns.push(`outdoor DECIMAL(5,2) PATH '$[${columns.length}]'`);
  return (
    "INSERT IGNORE INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id) " +
    `SELECT ?, ?, j.taken_at, j.air, j.rh, ${surface ? "j.surface" : "NULL"}, ${outdoor ? "j.outdoor" : "NULL"}, 'import', ? ` +
    `FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (${columns.join(", ")})) AS j`
  );
}

/** Longest JSON row: ["2026-01-15 07:00:00",-20.55,100,-30.55,-30.55], plus its comma; generous. */
const MAX_ROW_BYTES = 96;

/**
 * A batch's JSON written straight into a reused buffer, so a million rows leave almost nothing
 * for the garbage collector (the per-row strings die young, and no batch-sized string is made).
 * The text is ASCII: times and finite numbers, nothing to escape.
 */
class JsonBatch {
  private readonly buf = Buffer.allocUnsafe(BATCH_ROWS * MAX_ROW_BYTES + 2);
  private length = 0;
  rows = 0;

  constructor(
    private readonly surface: boolean,
    private readonly outdoor: boolean,
  ) {}

  add(r: ConvertedRow): void {
    if (this.length + MAX_ROW_BYTES > this.buf.length) throw new Error("JSON batch is full: send it before adding rows");
    let row = `${this.rows === 0 ? "[" : ","}["${r.takenAt}",${r.airTemperatureC},${r.relativeHumidityPct}`;
    if (this.surface) row += r.surfaceTemperatureC === null ? ",null" : `,${r.surfaceTemperatureC}`;
    if (this.outdoor) row += r.outdoorTemperatureC === null ? ",null" : `,${r.outdoorTemperatureC}`;
    this.length += this.buf.write(`${row}]`, this.length, "latin1");
    this.rows++;
  }

  /** The JSON array so far; valid until the next reset. */
  json(): Buffer {
    this.buf[this.length] = 0x5d; // ]
    return this.buf.subarray(0, this.length + 1);
  }

  reset(): void {
    this.length = 0;
    this.rows = 0;
  }
}

/** The last part of a browser-given name, without control characters, at most 255 characters. */
export function displayFileName(name: string): string {
  const base = name.split(/[/\\]/).pop() ?? "";
  const clean = base.replace(/\p{Cc}/gu, "").trim();
  const chars = Array.from(clean === "" || clean === "." || clean === ".." ? "readings.csv" : clean);
  return chars.slice(0, 255).join("");
}

const notFoundMessage = (missing: MappingProposal["missing"]) => {
  const names = missing.map((m) => (m.field === "timestamp" ? "time" : m.field));
  const list = names.length === 1 ? names[0] : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
  return `We could not find the ${list} column${names.length === 1 ? "" : "s"} in this file. Check it is the CSV your logger exported, or choose the columns yourself.`;
};

export class ReadingImportService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly events: CaseEventRecorder,
    private readonly clock: Clock,
    /** ReadingService: marks the room's stored evaluation out of date in the import's transaction. */
    private readonly changes: { markChanged(m: EntityManager, caseId: number, roomIds: readonly number[]): Promise<void> },
  ) {}

  /** How we would read the file, from its first 64 KB. 422 when it is not UTF-8 CSV or lacks the columns we need. */
  async preview(filePath: string): Promise<ImportPreview> {
    const { layout, proposal, problems } = await this.inspect(filePath);
    if (proposal.missing.length > 0) throw new UnprocessableError(notFoundMessage(proposal.missing), proposal.missing);
    return {
      delimiter: layout.delimiter,
      decimalComma: layout.decimalComma,
      hasHeader: layout.hasHeader,
      headers: layout.headers,
      mapping: proposal.mapping as Mapping,
      sampleRows: layout.dataRows.slice(0, 10),
      problems,
    };
  }

  /** Imports the file into the case's room; see the top of this file for the rules. */
  async import(input: ImportInput): Promise<ImportResult> {
    const { layout, proposal } = await this.inspect(input.filePath);
    const mapping = this.resolveMapping(layout, proposal, input.mapping);
    const convert = createRowConverter(mapping, { decimalComma: layout.decimalComma, nowMs: this.clock.now().getTime() });
    const fileName = displayFileName(input.fileName);

    return this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(ReadingImport);
      const record = await repo.save(
        repo.create({
          caseId: input.caseId,
          roomId: input.roomId,
          uploadedById: input.actorId,
          fileName,
          imported: 0,
          duplicates: 0,
          rejected: 0,
          rejectedReport: null,
        }),
      );
      const report = new RejectedReport();
      const counts = await this.streamRows(m, input, record.id, layout, mapping, convert, report);
      if (counts.dataRows === 0) {
        throw new UnprocessableError(
          "The file has no rows of readings under its header. Check you chose the file the logger exported.",
        );
      }
      if (counts.imported + counts.duplicates === 0) {
        throw new UnprocessableError(
          `None of the ${counts.dataRows} rows could be read, so nothing was imported. The first problems are listed; fix them or choose the columns and date format yourself.`,
          report.firstRejections,
        );
      }
      if (counts.imported > 0) await this.changes.markChanged(m, input.caseId, [input.roomId]);
      await repo.update(record.id, {
        imported: counts.imported,
        duplicates: counts.duplicates,
        rejected: report.count,
        rejectedReport: report.toCsv(),
      });
      await this.events.recordEvent(m, {
        caseId: input.caseId,
        actorId: input.actorId,
        type: "readings-imported",
        after: {
          importId: record.id,
          fileName,
          roomId: input.roomId,
          imported: counts.imported,
          duplicates: counts.duplicates,
          rejected: report.count,
        },
      });
      const result: ImportResult = {
        importId: record.id,
        imported: counts.imported,
        duplicates: counts.duplicates,
        rejected: report.count,
      };
      if (report.count > 0) result.rejectedReportUrl = `/api/cases/${input.caseId}/readings/imports/${record.id}/rejected.csv`;
      return result;
    });
  }

  /** The rejected-rows CSV of an import of this case ("row,reason" and nothing else when none were rejected). */
  async rejectedReport(caseId: number, importId: number): Promise<string> {
    const found = await this.dataSource
      .getRepository(ReadingImport)
      .findOne({ where: { id: importId, caseId }, select: { id: true, rejectedReport: true } });
    if (!found) throw new NotFoundError("That import was not found for this case.");
    return found.rejectedReport ?? "row,reason\n";
  }

  private async inspect(filePath: string): Promise<Inspection> {
    const fh = await open(filePath, "r");
    let head: Buffer;
    let complete: boolean;
    try {
      const { size } = await fh.stat();
      head = Buffer.alloc(Math.min(size, HEAD_BYTES));
      const { bytesRead } = await fh.read(head, 0, head.length, 0);
      head = head.subarray(0, bytesRead);
      complete = size <= HEAD_BYTES;
    } finally {
      await fh.close();
    }
    if (head.length === 0) throw new UnprocessableError("The file is empty. Choose the CSV file your logger exported.");
    const check = checkHead(head, complete);
    if (!check.ok) throw new UnprocessableError(check.message);
    const text = new TextDecoder("utf-8").decode(head.subarray(check.bomLength));

    let layout: Layout;
    try {
      layout = detectLayout(text, complete);
    } catch (e) {
      if (e instanceof CsvError) throw new UnprocessableError(`We could not read the file as CSV: ${e.message}`);
      throw e;
    }
    if (layout.dataRows.length === 0) {
      throw new UnprocessableError(
        "We found no rows of readings in the file. Check you chose the CSV file your logger exported.",
      );
    }
    const proposal = proposeMapping(
      layout.hasHeader ? layout.headers : null,
      layout.dataRows.slice(0, 1000),
      layout.decimalComma,
    );
    const problems: string[] = [];
    if (layout.noteRecords > 0) {
      problems.push(
        `The first ${layout.noteRecords === 1 ? "line looks" : `${layout.noteRecords} lines look`} like notes from the logger, not readings, and will be skipped.`,
      );
    }
    problems.push(...proposal.problems);
    return { layout, proposal, problems };
  }

  /** The proposal with the caller's overrides; 400 for a bad override, 422 when a required column is still unknown. */
  private resolveMapping(layout: Layout, proposal: MappingProposal, override: MappingOverride | undefined): Mapping {
    const given = override === undefined ? {} : parse(overrideSchema, { mapping: override }).mapping;
    const width = layout.headers.length;
    const merged: Partial<Mapping> = { ...proposal.mapping };
    for (const [key, value] of Object.entries(given) as [keyof Mapping, unknown][]) {
      if (value === undefined) continue;
      if (value === null) delete merged[key];
      else (merged as Record<string, unknown>)[key] = value;
    }
    const details: { field: string; message: string }[] = [];
    const used = new Map<number, string>();
    for (const role of COLUMN_ROLES) {
      const col = merged[role];
      if (col === undefined) continue;
      if (col >= width)
        details.push({
          field: `mapping.${role}`,
          message: `Column ${col} is not in the file: it has ${width} columns, numbered from 0.`,
        });
      const other = used.get(col);
      if (other !== undefined) details.push({ field: `mapping.${role}`, message: `Column ${col} is already used for ${other}.` });
      used.set(col, role);
    }
    if (details.length > 0) throw new ValidationError(`${details[0].field}: ${details[0].message}`, details);

    const movedTime = given.timestamp !== undefined || given.timeOfDay !== undefined;
    if (movedTime && given.dateFormat === undefined && merged.timestamp !== undefined) {
      const values = layout.dataRows
        .slice(0, 1000)
        .map((r) => `${r[merged.timestamp!] ?? ""} ${merged.timeOfDay === undefined ? "" : (r[merged.timeOfDay] ?? "")}`.trim());
      const guess = detectDateFormat(values);
      if (guess) merged.dateFormat = guess.format;
      else delete merged.dateFormat;
    }
    if (given.temperature !== undefined && given.temperatureUnit === undefined) {
      const header = layout.hasHeader ? (layout.headers[given.temperature] ?? "") : null;
      merged.temperatureUnit = temperatureUnitOf(
        header,
        layout.dataRows.slice(0, 1000),
        given.temperature,
        layout.decimalComma,
      ).unit;
    }

    const missing = proposal.missing.filter((m) =>
      m.field === "timestamp" ? merged.timestamp === undefined || merged.dateFormat === undefined : merged[m.field] === undefined,
    );
    if (merged.timestamp !== undefined && merged.dateFormat === undefined && !missing.some((m) => m.field === "timestamp")) {
      missing.unshift({
        field: "timestamp",
        message: `We could not read the dates in column ${merged.timestamp}. Choose the date format.`,
      });
    }
    if (missing.length > 0) throw new UnprocessableError(notFoundMessage(missing), missing);
    return merged as Mapping;
  }

  /** Streams the file's rows into readings; returns the counts. Throws (rolling back) on a broken file or a failed batch. */
  private async streamRows(
    m: EntityManager,
    input: ImportInput,
    importId: number,
    layout: Layout,
    mapping: Mapping,
    convert: ReturnType<typeof createRowConverter>,
    report: RejectedReport,
  ): Promise<{ dataRows: number; imported: number; duplicates: number }> {
    // The transaction's own connection, for a prepared statement: the JSON goes to the server as
    // one binary parameter, neither escaped into SQL text here nor lexed there.
    if (!m.queryRunner) throw new Error("streamRows must run inside a transaction");
    const raw = (await m.queryRunner.connect()) as PoolConnection;
    if (typeof raw.promise !== "function") throw new Error("The readings import needs the mysql2 driver.");
    const connection = raw.promise();
    const source = createReadStream(input.filePath, { highWaterMark: 64 * 1024 });
    const utf8 = new Utf8StreamCheck();
    const check = new Transform({
      transform(chunk: Buffer, _encoding, callback) {
        const bad = utf8.push(chunk);
        callback(bad ? new UnprocessableError(notUtf8Message(bad)) : null, chunk);
      },
      flush(callback) {
        const bad = utf8.end();
        callback(bad ? new UnprocessableError(notUtf8Message(bad)) : null);
      },
    });
    const parser = parseCsv(csvOptions(layout.delimiter));
    pipeline(source, check, parser, () => undefined); // errors surface on the parser

    let dataRows = 0;
    let imported = 0;
    let duplicates = 0;
    let sent = 0;
    const withSurface = mapping.surfaceTemperature !== undefined;
    const withOutdoor = mapping.outdoorTemperature !== undefined;
    const sql = insertBatchSql(withSurface, withOutdoor);
    const row = emptyRow();
    // Two buffers: one being filled while the other's batch is in flight (never more than one).
    const batches = [new JsonBatch(withSurface, withOutdoor), new JsonBatch(withSurface, withOutdoor)];
    let batch = batches[0];
    let inFlight: Promise<void> | null = null;
    let failure: unknown = null;

    const send = () => {
      const count = batch.rows;
      const json = batch.json();
      batch = batch === batches[0] ? batches[1] : batches[0];
      batch.reset();
      inFlight = connection
        .execute<ResultSetHeader>(sql, [input.caseId, input.roomId, importId, json])
        .then(([result]) => {
          imported += result.affectedRows;
          duplicates += count - result.affectedRows;
          sent += count;
          input.onBatch?.(sent);
        })
        .catch((e: unknown) => {
          failure ??= e;
        });
    };
    /** Waits for the batch in flight (at most one), then sends the next if there is one. */
    const flush = async () => {
      if (inFlight) {
        await inFlight;
        inFlight = null;
      }
      if (failure) throw failure;
      if (batch.rows > 0) send();
    };

    let recordIndex = 0;
    let line = 1;
    /** One record, as csv-parse hands it over; false when the batch is full and must be sent first. */
    const take = (record: string[]): boolean => {
      const at = line;
      line++;
      for (const cell of record) for (let i = cell.indexOf("\n"); i !== -1; i = cell.indexOf("\n", i + 1)) line++;
      if (recordIndex++ < layout.skipRecords || isBlankRecord(record)) return true;
      dataRows++;
      const reason = convert(record, row);
      if (reason !== null) report.add(at, reason);
      else batch.add(row);
      return batch.rows < BATCH_ROWS;
    };

    try {
      // Flowing mode: each record is handled as it is parsed and is garbage at once; the parser
      // pauses while a full batch waits for the one in flight.
      await new Promise<void>((resolve, reject) => {
        let settled = false;
        const fail = (e: unknown) => {
          if (settled) return;
          settled = true;
          reject(e);
        };
        parser.on("data", (record: string[]) => {
          if (settled) return;
          try {
            if (take(record)) return;
            parser.pause();
            flush().then(() => {
              if (!settled) parser.resume();
            }, fail);
          } catch (e) {
            fail(e);
          }
        });
        parser.on("error", fail);
        parser.on("end", () => {
          flush()
            .then(async () => {
              if (inFlight) await inFlight;
              if (failure) throw failure;
              settled = true;
              resolve();
            })
            .catch(fail);
        });
        parser.on("close", () => {
          if (!parser.readableEnded) fail(parser.errored ?? new Error("The file stream closed before the end."));
        });
      });
      return { dataRows, imported, duplicates };
    } catch (e) {
      if (e instanceof CsvError)
        throw new UnprocessableError(
          `Line ${line} could not be read as CSV (${e.message}). Check the file is a CSV export and has not been edited by hand.`,
        );
      throw e;
    } finally {
      parser.destroy();
      source.destroy();
      if (inFlight) await inFlight; // let a batch in flight finish before the transaction rolls back
    }
  }
}
