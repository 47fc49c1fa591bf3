// Reading an asset register file as rows of text cells, whatever it came as: CSV (UTF-8, with or
// without a byte-order mark, CRLF or LF, separated by comma, semicolon or tab) or an Excel workbook
// (.xlsx, its first sheet, read with exceljs's streaming reader). Neither is ever held whole in memory.
import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import { parse as parseCsv } from "csv-parse";
import ExcelJS from "exceljs";
import { UnprocessableError } from "../../lib/errors.js";

export type StockFileFormat = "csv" | "xlsx";
export type Separator = "," | ";" | "\t";

export interface StockFileHead {
  format: StockFileFormat;
  delimiter: Separator | null;
  headers: string[];
  /** Line (CSV) or row (workbook) number of the header. */
  headerLine: number;
  sampleRows: string[][];
}

export interface StockRecord {
  /** The file's own line number (CSV, the first line is 1) or row number (workbook). */
  line: number;
  cells: string[];
}

const HEAD_BYTES = 64 * 1024;
const SAMPLE_ROWS = 10;

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
 * The separator of a register is the one its header line uses most (a header names every column, so
 * it holds one fewer separators than columns; addresses in the rows may hold commas of their own).
 */
export function detectSeparator(firstLine: string): Separator {
  let best: Separator = ",";
  let bestCount = 0;
  for (const ch of ["\t", ";", ","] as const) {
    const n = countOutside(firstLine, ch);
    if (n > bestCount) [best, bestCount] = [ch, n];
  }
  return best;
}

/** An Excel cell's value as the text a person sees. */
export function cellText(value: unknown): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "string") return value;
  if (typeof value === "number") return Number.isInteger(value) ? value.toFixed(0) : String(value);
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if (value instanceof Date) return value.toISOString().slice(0, 10);
  if (typeof value === "object") {
    const v = value as { richText?: { text: string }[]; text?: unknown; result?: unknown; error?: unknown };
    if (Array.isArray(v.richText)) return v.richText.map((r) => r.text).join("");
    if ("result" in v) return cellText(v.result);
    if (v.text !== undefined) return cellText(v.text);
    if (v.error !== undefined) return "";
  }
  return String(value);
}

const isBlank = (cells: readonly string[]) => cells.every((c) => c.trim() === "");

/** Records in arrays of what the parser has ready: one promise per chunk of the file, not per row. */
async function* csvRecords(filePath: string, delimiter: Separator): AsyncGenerator<StockRecord[]> {
  const parser = createReadStream(filePath, { highWaterMark: 256 * 1024 }).pipe(
    parseCsv({
      delimiter,
      bom: true,
      relax_column_count: true,
      relax_quotes: true,
      // No `info` and no skip_empty_lines: the line numbers are counted here (a record is one line plus
      // the line breaks inside its quoted cells), which made parsing about 1.6× faster in bench:stock.
    }),
  );
  let line = 0;
  let ended = false;
  let failure: unknown = null;
  let wake: (() => void) | null = null;
  const signal = () => {
    wake?.();
    wake = null;
  };
  parser.on("readable", signal);
  parser.on("end", () => {
    ended = true;
    signal();
  });
  parser.on("error", (e) => {
    failure = e;
    signal();
  });
  try {
    for (;;) {
      if (failure) throw failure;
      const out: StockRecord[] = [];
      let record: string[] | null;
      while ((record = parser.read() as string[] | null) !== null) {
        line++;
        out.push({ line, cells: record });
        for (const cell of record) for (let i = cell.indexOf("\n"); i !== -1; i = cell.indexOf("\n", i + 1)) line++;
      }
      if (out.length) yield out;
      else if (ended) return;
      else await new Promise<void>((resolve) => (wake = resolve));
    }
  } finally {
    parser.destroy();
  }
}

async function* xlsxRecords(filePath: string): AsyncGenerator<StockRecord[]> {
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(filePath, {
    entries: "emit",
    sharedStrings: "cache",
    worksheets: "emit",
    styles: "ignore",
    hyperlinks: "ignore",
  });
  for await (const sheet of reader) {
    for await (const row of sheet) {
      const values = row.values as unknown[];
      const cells: string[] = [];
      for (let i = 1; i < values.length; i++) cells.push(cellText(values[i]).trim());
      yield [{ line: row.number, cells }];
    }
    return; // the first sheet only
  }
}

/** Every row of the file, the header included, blank rows left out, in arrays as they are read. */
export async function* stockRecordChunks(
  filePath: string,
  format: StockFileFormat,
  delimiter: Separator | null,
): AsyncGenerator<StockRecord[]> {
  const source = format === "xlsx" ? xlsxRecords(filePath) : csvRecords(filePath, delimiter ?? ",");
  for await (const chunk of source) {
    const kept = chunk.filter((r) => !isBlank(r.cells));
    if (kept.length) yield kept;
  }
}

/** Every row of the file, one at a time. */
export async function* stockRecords(
  filePath: string,
  format: StockFileFormat,
  delimiter: Separator | null,
): AsyncGenerator<StockRecord> {
  for await (const chunk of stockRecordChunks(filePath, format, delimiter)) yield* chunk;
}

/** The format, separator, header and first rows of the file; 422 for what we cannot read. */
export async function readStockHead(filePath: string): Promise<StockFileHead> {
  const head = await readHeadBytes(filePath);
  if (head.length === 0)
    throw new UnprocessableError("The file is empty. Choose the CSV or Excel export of your asset register.");
  let format: StockFileFormat = "csv";
  let delimiter: Separator | null = null;
  if (head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) format = "xlsx";
  else if (head[0] === 0xd0 && head[1] === 0xcf && head[2] === 0x11 && head[3] === 0xe0) {
    throw new UnprocessableError("This is an older Excel workbook (.xls). Save it as .xlsx or as CSV UTF-8 and upload it again.");
  } else {
    const bom = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
    let text: string;
    try {
      // A cut-off character at the end of the sample is not an error: drop the last partial line.
      text = new TextDecoder("utf-8", { fatal: true }).decode(trimToLastNewline(head.subarray(bom)));
    } catch {
      throw new UnprocessableError(
        "The file is not UTF-8 text. Open it in your spreadsheet program, save it as “CSV UTF-8” or as .xlsx, and upload it again.",
      );
    }
    const firstLine = text.split(/\r\n|\n|\r/).find((l) => l.trim() !== "") ?? "";
    delimiter = detectSeparator(firstLine);
  }
  const rows: StockRecord[] = [];
  try {
    for await (const r of stockRecords(filePath, format, delimiter)) {
      rows.push(r);
      if (rows.length > SAMPLE_ROWS) break;
    }
  } catch (e) {
    throw new UnprocessableError(
      format === "xlsx"
        ? `We could not read the workbook: ${(e as Error).message}`
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
