// The shape of a file from its first bytes: delimiter, decimal comma, notes above the header,
// the header row (if any) and the first data rows.
import { parse } from "csv-parse/sync";
import { DATE_FORMATS, parseDateTime } from "./dates.js";
import { detectDelimiter, type Delimiter } from "./delimiter.js";
import { parseNumber } from "./numbers.js";
import { isBlankRecord } from "./rows.js";

export interface Layout {
  delimiter: Delimiter;
  /** A comma is the decimal separator (semicolon- or tab-delimited files). */
  decimalComma: boolean;
  hasHeader: boolean;
  /** The header row's cells, or "Column 1", "Column 2"… without one. */
  headers: string[];
  /** CSV records before the first data row (notes, then the header). */
  skipRecords: number;
  /** Non-blank records above the header (or the data): notes a logger writes, skipped. */
  noteRecords: number;
  /** Data rows found in the sample, blank ones left out. */
  dataRows: string[][];
}

/** Options shared by the sample parse and the streaming import, so both count records alike. */
export function csvOptions(delimiter: Delimiter) {
  return { delimiter, relax_column_count: true, relax_quotes: true, skip_empty_lines: false, bom: true } as const;
}

function looksLikeValue(cell: string, decimalComma: boolean): boolean {
  if (parseNumber(cell, decimalComma) !== null) return true;
  return DATE_FORMATS.some((f) => parseDateTime(cell, f) !== null);
}

/** At least two cells, and half or more of them numbers or dates. */
function looksLikeData(record: readonly string[], decimalComma: boolean): boolean {
  let filled = 0;
  let values = 0;
  for (const raw of record) {
    const cell = raw.trim();
    if (cell === "") continue;
    filled++;
    if (looksLikeValue(cell, decimalComma)) values++;
  }
  return values >= 2 && values * 2 >= filled;
}

/**
 * `text`: the start of the file as text (BOM removed). `complete`: it is the whole file;
 * otherwise the last, possibly cut, line is dropped.
 */
export function detectLayout(text: string, complete: boolean): Layout {
  let sample = text;
  if (!complete) {
    const cut = Math.max(sample.lastIndexOf("\n"), sample.lastIndexOf("\r"));
    if (cut > 0) sample = sample.slice(0, cut + 1);
  }
  const delimiter = detectDelimiter(sample);
  const decimalComma = delimiter !== ",";
  const records = parse(sample, { ...csvOptions(delimiter), bom: false }) as string[][];

  const nonBlank: number[] = [];
  records.forEach((r, i) => {
    if (!isBlankRecord(r)) nonBlank.push(i);
  });
  const dataLike = new Map<number, boolean>();
  const isData = (i: number) => {
    let v = dataLike.get(i);
    if (v === undefined) dataLike.set(i, (v = looksLikeData(records[i], decimalComma)));
    return v;
  };

  // The first data-like row that most of the next five rows agree with.
  let start = -1;
  for (let k = 0; k < nonBlank.length && start === -1; k++) {
    if (!isData(nonBlank[k])) continue;
    const next = nonBlank.slice(k + 1, k + 6);
    if (next.filter(isData).length * 2 >= next.length) start = k;
  }

  let headerAt = -1; // index into records
  let dataFrom: number; // index into records
  if (start === -1) {
    // No data in the sample: the first row with two or more cells may still be a header.
    const first = nonBlank.find((i) => records[i].filter((c) => c.trim() !== "").length >= 2);
    if (first !== undefined) headerAt = first;
    dataFrom = headerAt === -1 ? records.length : headerAt + 1;
  } else {
    dataFrom = nonBlank[start];
    const before = start > 0 ? nonBlank[start - 1] : -1;
    if (before !== -1 && !isData(before) && records[before].filter((c) => c.trim() !== "").length >= 2) headerAt = before;
  }

  const hasHeader = headerAt !== -1;
  const width = Math.max(
    0,
    ...records.slice(dataFrom, dataFrom + 200).map((r) => r.length),
    hasHeader ? records[headerAt].length : 0,
  );
  const headers = hasHeader
    ? Array.from({ length: width }, (_, i) => (records[headerAt][i] ?? "").trim())
    : Array.from({ length: width }, (_, i) => `Column ${i + 1}`);
  const skipRecords = hasHeader ? headerAt + 1 : dataFrom;
  const dataRows = records.slice(skipRecords).filter((r) => !isBlankRecord(r));
  return {
    delimiter,
    decimalComma,
    hasHeader,
    headers,
    skipRecords,
    noteRecords: nonBlank.filter((i) => i < (hasHeader ? headerAt : dataFrom)).length,
    dataRows,
  };
}
