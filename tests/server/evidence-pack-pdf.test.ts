// The shared PDF layer (server/lib/pdf) on its own, read back with poppler-utils: text that is longer
// than a line, a table cell longer than a page, page numbers, and photos placed whole.
import { execFile } from "node:child_process";
import { createWriteStream } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { finished } from "node:stream/promises";
import { promisify } from "node:util";
import sharp from "sharp";
import { afterAll, beforeAll, expect, it } from "vitest";
import { PdfWriter } from "../../server/lib/pdf/pdf-document.js";
import { testClock } from "../support/test-clock.js";

const run = promisify(execFile);
let dir: string;
let file: string;

const LONG_WORDS = Array.from({ length: 900 }, (_, i) => `word${i}`).join(" ");
const UNBROKEN = "x".repeat(400);
const photo = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 90, g: 110, b: 80 } } })
    .jpeg()
    .toBuffer();

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "dewline-pdf-"));
  file = path.join(dir, "layer.pdf");
  const pdf = new PdfWriter({ title: "Layer check", organisationName: "Northgate Homes", createdAt: testClock.now() });
  const out = createWriteStream(file);
  pdf.stream.pipe(out);
  pdf.title("Layer check");
  pdf.heading("Long text");
  pdf.paragraph(`${LONG_WORDS} END-OF-PARAGRAPH`);
  pdf.paragraph(UNBROKEN, { label: "Unbroken" });
  pdf.heading("A table");
  pdf.table(
    [
      { header: "Label", width: 0.3 },
      { header: "Value", width: 0.7 },
    ],
    [
      ["short", "one line"],
      ["huge", `${LONG_WORDS} ${LONG_WORDS} END-OF-CELL`],
      ["after", "the row after the huge one"],
    ],
  );
  pdf.newPage();
  pdf.photoPage(await photo(3000, 1000), { width: 3000, height: 1000 }, ["Wide photo"]);
  pdf.newPage();
  pdf.photoPage(await photo(600, 2400), { width: 600, height: 2400 }, ["Tall photo"]);
  pdf.finish(["Footer line"]);
  await finished(out);
});
afterAll(() => rm(dir, { recursive: true, force: true }));

it("wraps long text and long cells over pages, losing nothing, with Page X of Y on every page", async () => {
  const pages = Number(/Pages:\s+(\d+)/.exec((await run("pdfinfo", [file])).stdout)?.[1]);
  const text = (await run("pdftotext", ["-layout", file, "-"])).stdout;
  const flat = text.replace(/\s+/g, " ");
  expect(flat).toContain("word899 END-OF-PARAGRAPH");
  expect(flat).toContain("word899 END-OF-CELL");
  expect(flat).toContain("the row after the huge one");
  // The unbroken string is broken across lines, every character kept.
  expect(text.replace(/[^x]/g, "").length).toBeGreaterThanOrEqual(400);
  expect(pages).toBeGreaterThanOrEqual(5);
  for (let p = 1; p <= pages; p++) {
    const page = (await run("pdftotext", ["-layout", "-f", String(p), "-l", String(p), file, "-"])).stdout;
    expect(page).toContain(`Page ${p} of ${pages}`);
    expect(page).toContain("Northgate Homes");
    expect(page).toContain("Footer line");
  }
});

it("places each photo whole: the same scale across and down, inside the page's margins", async () => {
  const rows = (await run("pdfimages", ["-list", file])).stdout
    .trim()
    .split("\n")
    .slice(2)
    .map((line) => line.trim().split(/\s+/));
  expect(rows).toHaveLength(2);
  for (const r of rows) {
    const [width, height, xPpi, yPpi] = [Number(r[3]), Number(r[4]), Number(r[12]), Number(r[13])];
    // Equal pixels per inch both ways: the aspect ratio is kept (a crop or a stretch would differ).
    expect(xPpi).toBe(yPpi);
    // Placed size in points (72 a inch) within A4's 595 × 842 less the 50-point side margins.
    expect((width / xPpi) * 72).toBeLessThanOrEqual(595.28 - 100 + 1);
    expect((height / yPpi) * 72).toBeLessThanOrEqual(841.89 - 64 - 72 + 1);
  }
});
