// Reads a landlord's table file (CSV text or an .xlsx workbook's first sheet) into rows of text
// cells: the header row first. CSV: UTF-8 with or without a BOM, CRLF or LF, comma, semicolon or tab.
import { readFile } from "node:fs/promises";
import ExcelJS from "exceljs";
import { parse } from "csv-parse/sync";
import { ValidationError } from "../../lib/errors.js";
import { detectDelimiter } from "../readings/csv/delimiter.js";
import { checkHead } from "../readings/csv/encoding.js";
import { csvOptions } from "../readings/csv/layout.js";

export interface TableFile {
  kind: "csv" | "xlsx";
  /** Every row, the header first, each cell trimmed text; blank rows kept so row numbers match the file's. */
  rows: string[][];
}

const bad = (message: string) => new ValidationError(`file: ${message}`, [{ field: "file", message }]);

const isZip = (b: Buffer) => b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04;

/** An .xlsx cell as text: dates as YYYY-MM-DD, links and rich text as their text, formulas as their result. */
function cellText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return "";
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? "" : value.toISOString().slice(0, 10);
  if (typeof value === "object") {
    if ("richText" in value) return value.richText.map((r) => r.text).join("");
    if ("text" in value && typeof value.text === "string") return value.text;
    if ("result" in value) return cellText((value.result ?? null) as ExcelJS.CellValue);
    if ("error" in value) return "";
    return "";
  }
  return String(value);
}

async function readXlsx(path: string): Promise<string[][]> {
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.readFile(path);
  } catch {
    throw bad("This workbook could not be read. Save it again as .xlsx, or as CSV (UTF-8).");
  }
  const sheet = workbook.worksheets[0];
  if (!sheet) throw bad("The workbook has no sheet.");
  const rows: string[][] = [];
  sheet.eachRow({ includeEmpty: true }, (row, n) => {
    const values = Array.isArray(row.values) ? row.values.slice(1) : [];
    rows[n - 1] = values.map((v) => cellText(v as ExcelJS.CellValue).trim());
  });
  return Array.from(rows, (r) => r ?? []);
}

/** Reads the file; a file that is neither UTF-8 CSV nor .xlsx is a 400 that says how to save it. */
export async function readTableFile(path: string): Promise<TableFile> {
  const buf = await readFile(path);
  if (isZip(buf)) return { kind: "xlsx", rows: await readXlsx(path) };
  const head = checkHead(buf, true);
  if (!head.ok) throw bad(head.message);
  const text = buf.subarray(head.bomLength).toString("utf8");
  const records = parse(text, { ...csvOptions(detectDelimiter(text)), bom: false }) as string[][];
  return { kind: "csv", rows: records.map((r) => r.map((c) => c.trim())) };
}
