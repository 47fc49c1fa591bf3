// Streams a table view as CSV (csv-stringify) or .xlsx (exceljs's streaming WorkbookWriter) straight
// into the response: rows arrive page by page and are written as they come, so a 100 000-row export
// never sits in memory, and the next page is only fetched once the client has taken the last one.
import { once } from "node:events";
import { PassThrough, Readable, type Writable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { performance } from "node:perf_hooks";
import type { Response } from "express";
import { stringify } from "csv-stringify";
import ExcelJS from "exceljs";
import { localDate } from "../../src/lib/domain/working-days.js";
import type { ExportCell, ExportColumn, ExportFormat } from "../../src/lib/contracts/exports.js";

export type { ExportCell, ExportColumn, ExportFormat } from "../../src/lib/contracts/exports.js";

/** Rows read per page while exporting: small enough to keep memory flat, large enough to keep queries few. */
export const EXPORT_PAGE_SIZE = 1000;

/**
 * Cells a spreadsheet could run as a formula: those starting with =, +, -, @, a tab or a carriage
 * return. Source: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection), which
 * advises prefixing such a cell with a single quote so that it is shown as text.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/** Text as it is written to a CSV or xlsx cell: a leading single quote when it could start a formula. */
export const neutralise = (text: string): string => (FORMULA_START.test(text) ? `'${text}` : text);

/**
 * The value written for a cell. Text is always neutralised, even when it looks like a number, since it
 * came from a person. Real numbers (a temperature of -3.5 °C) stay numbers: a number cell in xlsx, and in
 * CSV the plain digits, which spreadsheets read as a number, never as a formula.
 */
function csvCell(value: ExportCell): string {
  if (value === null) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "Yes" : "No";
  return neutralise(value);
}

function xlsxCell(value: ExportCell): string | number | null {
  if (value === null) return null;
  if (typeof value === "number") return Number.isFinite(value) ? value : null;
  if (typeof value === "boolean") return value ? "Yes" : "No";
  return neutralise(value);
}

/**
 * One term of a view's ORDER BY, for keyset paging: a fixed SQL expression (never user text) and its
 * direction. `nullable` when the expression can be NULL: MariaDB sorts NULL below every value (first
 * ascending, last descending), and "after" is worked out the same way.
 */
export interface KeyTerm {
  expr: string;
  desc?: boolean;
  nullable?: boolean;
}

/**
 * The WHERE clause for "comes after the row whose sort values are `values`" in the order of `terms`
 * (the last term must make the order total, e.g. the id), with its named parameters (`:k0`, `:k1`…).
 * A redundant bound on the first term lets MariaDB start its index range there rather than at the top.
 */
export function keysetAfter(
  terms: readonly KeyTerm[],
  values: readonly unknown[],
): { sql: string; params: Record<string, unknown> } {
  if (terms.length !== values.length) throw new Error("keysetAfter: one value per sort term.");
  const params: Record<string, unknown> = {};
  const equal: string[] = [];
  const either: string[] = [];
  terms.forEach((term, i) => {
    const key = `k${i}`;
    const value = values[i] ?? null;
    params[key] = value;
    // Strictly after this term's value, nulls counted as the smallest.
    let beyond: string | null;
    if (value === null) beyond = term.desc ? null : `(${term.expr}) IS NOT NULL`;
    else if (term.desc)
      beyond = term.nullable ? `((${term.expr}) < :${key} OR (${term.expr}) IS NULL)` : `(${term.expr}) < :${key}`;
    else beyond = `(${term.expr}) > :${key}`;
    if (beyond) either.push([...equal, beyond].join(" AND "));
    equal.push(`(${term.expr}) <=> :${key}`);
  });
  const first = terms[0];
  const bound =
    first && !first.nullable && values[0] !== null && values[0] !== undefined
      ? `(${first.expr}) ${first.desc ? "<=" : ">="} :k0 AND `
      : "";
  return { sql: either.length ? `(${bound}(${either.map((e) => `(${e})`).join(" OR ")}))` : "1 = 0", params };
}

/** A page of an export read by keyset: the rows, and the sort values of its last row (null when empty). */
export interface KeysetPage<T> {
  rows: readonly T[];
  last: readonly unknown[] | null;
}

/** How long each page's query took, for the log line at the end of an export and for bench:export. */
export interface PageTimes {
  pages: number;
  rows: number;
  firstMs: number | null;
  lastMs: number | null;
  maxMs: number;
}

/**
 * Pages of rows from `fetchPage(after, pageSize)`, each starting after the last row of the one before
 * (its sort key and id), until a short page says there are no more. Unlike an offset, a keyset page
 * costs the same at the 100 000th row as at the first. `times` is filled in as the pages are read.
 */
export async function* keysetPages<T>(
  fetchPage: (after: readonly unknown[] | null, pageSize: number) => Promise<KeysetPage<T>>,
  pageSize = EXPORT_PAGE_SIZE,
  times?: PageTimes,
): AsyncGenerator<readonly T[]> {
  let after: readonly unknown[] | null = null;
  for (;;) {
    const start = performance.now();
    const { rows, last } = await fetchPage(after, pageSize);
    const ms = performance.now() - start;
    if (times) {
      times.pages += 1;
      times.rows += rows.length;
      times.firstMs ??= ms;
      times.lastMs = ms;
      times.maxMs = Math.max(times.maxMs, ms);
    }
    if (rows.length) yield rows;
    if (rows.length < pageSize || !last) return;
    after = last;
  }
}

export const newPageTimes = (): PageTimes => ({ pages: 0, rows: 0, firstMs: null, lastMs: null, maxMs: 0 });

export interface TableExport<T> {
  format: ExportFormat;
  /** The view's name, for the file name and the sheet ("homes" → homes-2026-12-04.csv). */
  view: string;
  /** From the injectable clock: the date in the file name (London). */
  now: Date;
  columns: readonly ExportColumn<T>[];
  /** The rows, page by page, in the view's order. */
  pages: AsyncIterable<readonly T[]>;
  /** Filled in by keysetPages: logged once the file is sent (bench:export reads that line). */
  times?: PageTimes;
}

export const exportFileName = (view: string, now: Date, format: ExportFormat) => `${view}-${localDate(now)}.${format}`;

const MEDIA_TYPES: Record<ExportFormat, string> = {
  csv: "text/csv; charset=utf-8",
  xlsx: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
};

/**
 * Sends the export. The first page is read before anything is written, so a failure there (the
 * database, a bad filter) is still an ordinary error reply; after that a failure cuts the download
 * short (the response is destroyed, so the client sees an incomplete transfer, never a file that
 * looks whole). A client that goes away stops the reading of further pages.
 */
export async function sendTableExport<T>(res: Response, spec: TableExport<T>): Promise<void> {
  const iterator = spec.pages[Symbol.asyncIterator]();
  const first = await iterator.next();
  async function* rest(): AsyncGenerator<readonly T[]> {
    try {
      if (!first.done) yield first.value;
      for (;;) {
        const next = await iterator.next();
        if (next.done) return;
        yield next.value;
      }
    } finally {
      await iterator.return?.();
    }
  }

  res.status(200);
  res.setHeader("Content-Type", MEDIA_TYPES[spec.format]);
  res.setHeader("Cache-Control", "no-store");
  res.attachment(exportFileName(spec.view, spec.now, spec.format));

  try {
    if (spec.format === "csv") await writeCsv(res, spec.columns, rest());
    else await writeXlsx(res, spec.view, spec.columns, rest());
    if (spec.times) {
      const { pages, rows, firstMs, lastMs, maxMs } = spec.times;
      const round = (ms: number | null) => (ms === null ? null : Math.round(ms * 10) / 10);
      res.req.log?.info(
        {
          export: spec.view,
          format: spec.format,
          rows,
          pages,
          firstPageMs: round(firstMs),
          lastPageMs: round(lastMs),
          maxPageMs: round(maxMs),
        },
        "export sent",
      );
    }
  } catch (error) {
    if (!res.destroyed) res.destroy(error instanceof Error ? error : new Error(String(error)));
    // A client that went away is not a server error; anything else is logged by the caller's logger.
    if (!isClientGone(error)) res.req.log?.error({ err: error }, "an export stopped part-way");
  }
}

const isClientGone = (error: unknown) =>
  typeof error === "object" &&
  error !== null &&
  ["ERR_STREAM_PREMATURE_CLOSE", "ECONNRESET", "EPIPE"].includes(String((error as { code?: unknown }).code));

async function writeCsv<T>(res: Writable, columns: readonly ExportColumn<T>[], pages: AsyncIterable<readonly T[]>) {
  async function* records() {
    yield columns.map((c) => neutralise(c.header));
    for await (const rows of pages) for (const row of rows) yield columns.map((c) => csvCell(c.value(row)));
  }
  // The BOM lets Excel read the file as UTF-8; CRLF line ends as RFC 4180. pipeline carries the back-pressure
  // from the socket to the generator and ends the page reading when the client goes away.
  await pipeline(Readable.from(records()), stringify({ bom: true, record_delimiter: "windows" }), res);
}

/** Resolves when `out` can take more (or has closed), so the next page waits for the client. */
async function roomIn(out: Writable): Promise<void> {
  // exceljs hands its bytes to the zip writer asynchronously: let them reach `out` first.
  await new Promise((resolve) => setImmediate(resolve));
  while (out.writableNeedDrain && !out.destroyed) {
    await Promise.race([once(out, "drain"), once(out, "close")]);
  }
  if (out.destroyed) throw Object.assign(new Error("The client went away."), { code: "ERR_STREAM_PREMATURE_CLOSE" });
}

async function writeXlsx<T>(
  res: Response,
  view: string,
  columns: readonly ExportColumn<T>[],
  pages: AsyncIterable<readonly T[]>,
) {
  const out = new PassThrough();
  const sending = pipeline(out, res);
  // Inline strings (no shared-strings table, which would keep every distinct text in memory) and no styles.
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: out, useSharedStrings: false, useStyles: false });
  const sheet = workbook.addWorksheet(view);
  sheet.addRow(columns.map((c) => neutralise(c.header))).commit();
  for await (const rows of pages) {
    for (const row of rows) sheet.addRow(columns.map((c) => xlsxCell(c.value(row)))).commit();
    await roomIn(out);
  }
  sheet.commit();
  await workbook.commit();
  await sending;
}
