// Reading a landlord's table file (an asset register, a tenancy list) as rows of text cells, whatever
// it came as: CSV (UTF-8 with or without a byte-order mark, CRLF or LF, separated by comma, semicolon
// or tab, quoted cells across lines) or an Excel workbook (.xlsx, its first sheet, read with exceljs's
// streaming reader). Rows come in arrays as the file is read, each with the file's own line (CSV) or
// row (workbook) number; the file is never held whole in memory. CSV is parsed by papaparse (about
// twice as fast as csv-parse on a 100 000-row register), paused while the reader's consumer works.
import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import ExcelJS from "exceljs";
import Papa from "papaparse";
import { UnprocessableError } from "./errors.js";

export type TableFileFormat = "csv" | "xlsx";
export type Separator = "," | ";" | "\t";

export interface TableRecord {
  /** The file's own line number (CSV, the first line is 1) or row number (workbook). */
  line: number;
  cells: string[];
}

export interface TableHead {
  format: TableFileFormat;
  /** The CSV separator, detected from the header line; null for a workbook. */
  delimiter: Separator | null;
  /** The first non-blank row's cells, trimmed. */
  headers: string[];
  /** Line (CSV) or row (workbook) number of the header. */
  headerLine: number;
  /** The first non-blank rows under the header. */
  sampleRows: string[][];
}

const HEAD_BYTES = 64 * 1024;
const CSV_CHUNK_BYTES = 32 * 1024;

const SAVE_AS =
  "Open it in your spreadsheet program, save it as “CSV UTF-8” or as an Excel workbook (.xlsx), and upload it again.";

async function readHeadBytes(filePath: string): Promise<Buffer> {
  const fh = await open(filePath, "r");
  try {
    const buf = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await fh.read(buf, 0, HEAD_BYTES, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await fh.close();
  }
}

/** Occurrences of `ch` outside double quotes in one line. */
function countOutside(line: string, ch: string): number {
  let n = 0;
  let quoted = false;
  for (const c of line) {
    if (c === '"') quoted = !quoted;
    else if (c === ch && !quoted) n++;
  }
  return n;
}

/**
 * The separator is the one the header line uses most (a header names every column, so it holds one
 * fewer separators than columns; addresses in the rows may hold commas of their own).
 */
export function detectSeparator(headerLine: string): Separator {
  let best: Separator = ",";
  let bestCount = 0;
  for (const ch of ["\t", ";", ","] as const) {
    const n = countOutside(headerLine, ch);
    if (n > bestCount) [best, bestCount] = [ch, n];
  }
  return best;
}

/** An Excel cell's value as the text a person sees: dates as YYYY-MM-DD, formulas as their result. */
export function cellText(value: unknown): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "string") return value;
  if (typeof value === "number") return Number.isInteger(value) ? value.toFixed(0) : String(value);
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? "" : value.toISOString().slice(0, 10);
  if (typeof value === "object") {
    const v = value as { richText?: { text: string }[]; text?: unknown; result?: unknown; error?: unknown };
    if (Array.isArray(v.richText)) return v.richText.map((r) => r.text).join("");
    if ("result" in v) return cellText(v.result);
    if (v.text !== undefined) return cellText(v.text);
    if (v.error !== undefined) return "";
  }
  return String(value);
}

export const isBlankRow = (cells: readonly string[]) => cells.every((c) => c.trim() === "");

/** Lines a record spans beyond its first: the line breaks inside its quoted cells. */
function extraLines(cells: readonly string[]): number {
  let n = 0;
  for (const cell of cells) for (let i = cell.indexOf("\n"); i !== -1; i = cell.indexOf("\n", i + 1)) n++;
  return n;
}

/**
 * CSV records in the arrays papaparse hands over (one per chunk of the file). Papaparse is paused
 * while the consumer holds a chunk, and the file stream with it, so memory stays at a chunk or two.
 */
async function* csvRecords(filePath: string, delimiter: Separator): AsyncGenerator<TableRecord[]> {
  const input = createReadStream(filePath, { encoding: "utf8", highWaterMark: CSV_CHUNK_BYTES });
  const queue: string[][][] = [];
  let parser: Papa.Parser | null = null;
  let done = false;
  let failure: unknown = null;
  let wake: (() => void) | null = null;
  const signal = () => {
    wake?.();
    wake = null;
  };
  let line = 0;
  let first = true;
  Papa.parse<string[]>(input, {
    delimiter,
    header: false,
    dynamicTyping: false,
    skipEmptyLines: false,
    chunk: (results, p) => {
      parser = p;
      const quoteError = results.errors.find((e) => e.code === "MissingQuotes");
      if (quoteError) {
        failure = new UnprocessableError(`We could not read the file as CSV: a quoted cell is never closed. ${SAVE_AS}`);
        p.abort();
      } else {
        queue.push(results.data);
        // Pausing papaparse stops its parsing, not its reading: the file stream is paused too.
        p.pause();
        input.pause();
      }
      signal();
    },
    complete: () => {
      done = true;
      signal();
    },
    error: (e: Error) => {
      failure = e;
      signal();
    },
  });
  input.on("error", (e) => {
    failure = e;
    signal();
  });
  try {
    for (;;) {
      if (failure) throw failure;
      const rows = queue.shift();
      if (rows) {
        const out: TableRecord[] = new Array<TableRecord>(rows.length);
        for (let i = 0; i < rows.length; i++) {
          const cells = rows[i];
          if (first) {
            first = false;
            if (cells.length && cells[0].charCodeAt(0) === 0xfeff) cells[0] = cells[0].slice(1);
          }
          line++;
          out[i] = { line, cells };
          line += extraLines(cells);
        }
        yield out;
        continue;
      }
      if (done) return;
      // Resuming may hand over the next chunk at once, before the promise is awaited.
      await new Promise<void>((resolve) => {
        wake = resolve;
        (parser as Papa.Parser | null)?.resume();
        input.resume();
      });
    }
  } finally {
    if (!done) (parser as Papa.Parser | null)?.abort();
    input.destroy();
  }
}

const XLSX_CHUNK_ROWS = 200;

async function* xlsxRecords(filePath: string): AsyncGenerator<TableRecord[]> {
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(filePath, {
    entries: "emit",
    sharedStrings: "cache",
    worksheets: "emit",
    // Styles say which numbers are dates; hyperlinks are kept as their text.
    styles: "cache",
    hyperlinks: "cache",
  });
  let out: TableRecord[] = [];
  for await (const sheet of reader) {
    for await (const row of sheet) {
      const values = row.values as unknown[];
      const cells: string[] = [];
      for (let i = 1; i < values.length; i++) cells.push(cellText(values[i]).trim());
      out.push({ line: row.number, cells });
      if (out.length >= XLSX_CHUNK_ROWS) {
        yield out;
        out = [];
      }
    }
    break; // the first sheet only
  }
  if (out.length) yield out;
}

/** Every non-blank record of the file, the header included, in arrays as they are read. */
async function* allRecords(
  filePath: string,
  format: TableFileFormat,
  delimiter: Separator | null,
): AsyncGenerator<TableRecord[]> {
  const source = format === "xlsx" ? xlsxRecords(filePath) : csvRecords(filePath, delimiter ?? ",");
  for await (const chunk of source) {
    const kept = chunk.filter((r) => !isBlankRow(r.cells));
    if (kept.length) yield kept;
  }
}

/** The rows under the header (blank rows left out), in arrays as they are read. */
export async function* tableRowChunks(
  filePath: string,
  head: Pick<TableHead, "format" | "delimiter" | "headerLine">,
): AsyncGenerator<TableRecord[]> {
  for await (const chunk of allRecords(filePath, head.format, head.delimiter)) {
    if (chunk[chunk.length - 1].line <= head.headerLine) continue;
    yield chunk[0].line > head.headerLine ? chunk : chunk.filter((r) => r.line > head.headerLine);
  }
}

/** The format, separator, header and first rows of the file; 422 with what to do for a file we cannot read. */
export async function readTableHead(filePath: string, sampleRows = 10): Promise<TableHead> {
  const head = await readHeadBytes(filePath);
  if (head.length === 0)
    throw new UnprocessableError("The file is empty. Choose the CSV or Excel (.xlsx) file and upload it again.");
  let format: TableFileFormat = "csv";
  let delimiter: Separator | null = null;
  if (head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) format = "xlsx";
  else if (head[0] === 0xd0 && head[1] === 0xcf && head[2] === 0x11 && head[3] === 0xe0) {
    throw new UnprocessableError("This is an older Excel workbook (.xls). Save it as .xlsx or as CSV UTF-8 and upload it again.");
  } else {
    const bom = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
    let text: string;
    try {
      // UTF-16 has a zero byte beside every ASCII character; a cut-off character at the end of the
      // sample is not an error: drop the last partial line.
      if (head.subarray(0, 4096).includes(0)) throw new Error("zero bytes");
      text = new TextDecoder("utf-8", { fatal: true }).decode(trimToLastNewline(head.subarray(bom)));
    } catch {
      throw new UnprocessableError(`The file is not UTF-8 text. ${SAVE_AS}`);
    }
    const firstLine = text.split(/\r\n|\n|\r/).find((l) => l.trim() !== "") ?? "";
    delimiter = detectSeparator(firstLine);
  }
  const rows: TableRecord[] = [];
  try {
    outer: for await (const chunk of allRecords(filePath, format, delimiter)) {
      for (const r of chunk) {
        rows.push(r);
        if (rows.length > sampleRows) break outer;
      }
    }
  } catch (e) {
    if (e instanceof UnprocessableError) throw e;
    throw new UnprocessableError(
      format === "xlsx"
        ? `We could not read the workbook: ${(e as Error).message}. Save it again as .xlsx, or as CSV UTF-8.`
        : `We could not read the file as CSV: ${(e as Error).message}`,
    );
  }
  const header = rows.shift();
  if (!header) throw new UnprocessableError("The file has no header row. The first row must name the columns.");
  return {
    format,
    delimiter,
    headers: header.cells.map((h) => h.trim()),
    headerLine: header.line,
    sampleRows: rows.map((r) => r.cells),
  };
}

function trimToLastNewline(buf: Buffer): Buffer {
  if (buf.length < HEAD_BYTES - 3) return buf;
  const at = buf.lastIndexOf(0x0a);
  return at === -1 ? buf : buf.subarray(0, at);
}
