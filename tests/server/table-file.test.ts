// The shared reader of landlords' table files: what a CSV or a workbook reads as, line numbers
// included, and the clear refusals of what it cannot read.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { afterAll, describe, expect, it } from "vitest";
import { UnprocessableError } from "../../server/lib/errors.js";
import { readTableHead, tableRowChunks, type TableRecord } from "../../server/lib/table-file.js";

const dir = mkdtempSync(path.join(tmpdir(), "dewline-table-file-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

let n = 0;
function fileOf(content: Buffer | string): string {
  const file = path.join(dir, `f${++n}`);
  writeFileSync(file, content);
  return file;
}

async function rowsOf(file: string): Promise<TableRecord[]> {
  const head = await readTableHead(file);
  const out: TableRecord[] = [];
  for await (const chunk of tableRowChunks(file, head)) out.push(...chunk);
  return out;
}

describe("reading a table file", () => {
  it("reads a CSV with a BOM, CRLF, semicolons, a blank line and a quoted cell over two lines, keeping the file's line numbers", async () => {
    const text = [
      "",
      "UPRN;Address;Note",
      '1;"2 Elm Road, Leeds";a',
      '2;"3 Oak St";"two',
      'lines"',
      "",
      "3;4 Ash Lane;c",
      "",
    ].join("\r\n");
    const file = fileOf(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)]));
    const head = await readTableHead(file);
    expect(head).toMatchObject({ format: "csv", delimiter: ";", headers: ["UPRN", "Address", "Note"], headerLine: 2 });
    expect(head.sampleRows).toEqual([
      ["1", "2 Elm Road, Leeds", "a"],
      ["2", "3 Oak St", "two\r\nlines"],
      ["3", "4 Ash Lane", "c"],
    ]);
    expect((await rowsOf(file)).map((r) => [r.line, r.cells[0]])).toEqual([
      [3, "1"],
      [4, "2"],
      [7, "3"],
    ]);
  });

  it("tells a tab from a comma by the header line", async () => {
    const file = fileOf("UPRN\tAddress\n1\t2 Elm Road, Leeds\n");
    expect((await readTableHead(file)).delimiter).toBe("\t");
    expect((await rowsOf(file))[0].cells).toEqual(["1", "2 Elm Road, Leeds"]);
  });

  it("reads a file larger than its chunks whole: every row, in order, accents and line numbers intact", async () => {
    const lines = ["UPRN,Town,Note"];
    for (let i = 0; i < 30_000; i++) lines.push(i % 1000 === 7 ? `${i},Ystradgynlais é,"a\nb"` : `${i},Llanfair ŵ,x`);
    const rows = await rowsOf(fileOf(lines.join("\n") + "\n"));
    expect(rows).toHaveLength(30_000);
    // Each quoted two-line cell pushes the following lines down by one.
    let line = 2;
    rows.forEach((r, i) => {
      expect(r.line).toBe(line);
      expect(r.cells[0]).toBe(String(i));
      expect(r.cells[1]).toBe(i % 1000 === 7 ? "Ystradgynlais é" : "Llanfair ŵ");
      line += i % 1000 === 7 ? 2 : 1;
    });
  });

  it("reads an .xlsx workbook's first sheet: dates, links and numbers as a person sees them", async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Homes");
    ws.addRow(["UPRN", "Email", "Since", " Area "]);
    ws.addRow([100023336956, { text: "a@b.example", hyperlink: "mailto:a@b.example" }, new Date(Date.UTC(2024, 8, 2)), 45.5]);
    ws.addRow([]);
    ws.addRow([7]);
    wb.addWorksheet("Other").addRow(["not", "read"]);
    const file = fileOf(Buffer.from(await wb.xlsx.writeBuffer()));
    const head = await readTableHead(file);
    expect(head).toMatchObject({ format: "xlsx", delimiter: null, headers: ["UPRN", "Email", "Since", "Area"], headerLine: 1 });
    expect((await rowsOf(file)).map((r) => [r.line, r.cells])).toEqual([
      [2, ["100023336956", "a@b.example", "2024-09-02", "45.5"]],
      [4, ["7"]],
    ]);
  });

  it("refuses with a clear 422 what it cannot read", async () => {
    const refusal = (content: Buffer | string) =>
      readTableHead(fileOf(content)).then(
        () => "read",
        (e: unknown) => (e instanceof UnprocessableError ? e.message : `other: ${String(e)}`),
      );
    expect(await refusal("")).toMatch(/^The file is empty/);
    expect(await refusal(Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]))).toMatch(
      /older Excel workbook \(\.xls\)/,
    );
    expect(await refusal(Buffer.from([0xff, 0xfe, 0x55, 0x00, 0x50, 0x00]))).toMatch(/not UTF-8 text/);
    expect(await refusal(Buffer.from("UPRN,Town\n1,Caf\xe9\n", "latin1"))).toMatch(/not UTF-8 text/);
    expect(await refusal("\n\n  \n")).toMatch(/no header row/);
    expect(await refusal('UPRN,Town\n1,"Leeds\n2,York\n')).toMatch(/quoted cell is never closed/);
  });
});
