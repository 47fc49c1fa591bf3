// A small layer over pdfkit for the PDFs the server makes (the case evidence pack; the board report
// later): A4 pages in Atkinson Hyperlegible Next, a running header (the landlord's name and the
// document's title) and footer (a line of the caller's and "Page X of Y"), headings, wrapped text,
// tables, a line chart drawn with paths, and photos scaled to fit, never cropped.
//
// Pages are buffered (pdfkit's bufferPages) only so that "of Y" can be written once Y is known: what
// is held is each page's content stream (text and paths). Images are written to the output as soon as
// they are placed, so a document's photos never sit in memory together.
import { createRequire } from "node:module";
import PDFDocument from "pdfkit";

const require = createRequire(import.meta.url);
const FONT_FILES = {
  regular: require.resolve("@fontsource/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-400-normal.woff"),
  bold: require.resolve("@fontsource/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-700-normal.woff"),
};

const A4 = { width: 595.28, height: 841.89 };
const MARGIN = { top: 64, bottom: 72, left: 50, right: 50 };
const INK = "#1f2933";
const SOFT = "#52606d";
const RULE = "#cbd2d9";

export interface PdfOptions {
  /** The document's title, in the running header and the file's metadata. */
  title: string;
  /** Whose document it is: the landlord's name, in the running header. */
  organisationName: string;
  /** When the document was made (the file's metadata; from the app's clock). */
  createdAt: Date;
}

export interface TableColumn {
  header: string;
  /** Share of the content width (the shares of a table add up to 1). */
  width: number;
}

export interface ChartSeries {
  label: string;
  colour: string;
  /** x: milliseconds since the epoch; y: the value. In any order. */
  points: readonly { x: number; y: number }[];
}

export interface LineChartOptions {
  title: string;
  yLabel: string;
  series: readonly ChartSeries[];
  /** Horizontal lines across the chart, e.g. a limit from a standard. */
  thresholds?: readonly { y: number; label: string }[];
  /** How an x value is written under the axis. */
  formatX: (x: number) => string;
  height?: number;
}

/**
 * One PDF being written. Pipe `stream` where it should go before writing anything, then call
 * `finish(footerLine)` once: it writes every page's header and footer and ends the document.
 */
export class PdfWriter {
  readonly stream: PDFKit.PDFDocument;
  private readonly doc: PDFKit.PDFDocument;

  constructor(private readonly options: PdfOptions) {
    this.doc = new PDFDocument({
      size: "A4",
      margins: MARGIN,
      bufferPages: true,
      autoFirstPage: true,
      info: { Title: options.title, Author: options.organisationName, Creator: "Dewline", CreationDate: options.createdAt },
      displayTitle: true,
      lang: "en-GB",
    });
    this.stream = this.doc;
    this.doc.registerFont("Body", FONT_FILES.regular);
    this.doc.registerFont("Bold", FONT_FILES.bold);
    this.doc.font("Body").fontSize(10).fillColor(INK);
  }

  private get contentWidth(): number {
    return A4.width - MARGIN.left - MARGIN.right;
  }

  private get bottom(): number {
    return A4.height - MARGIN.bottom;
  }

  /** Room left on the page below the cursor. */
  private get roomLeft(): number {
    return this.bottom - this.doc.y;
  }

  /** A new page, unless the cursor already sits at the top of an empty one. */
  newPage(): void {
    if (this.doc.y > MARGIN.top + 1) this.doc.addPage();
  }

  /** Starts a new page when less than `height` is left on this one. */
  keepTogether(height: number): void {
    if (this.roomLeft < height) this.doc.addPage();
  }

  /** A document-level title (the first page). */
  title(text: string, subtitle?: string): void {
    this.doc.font("Bold").fontSize(20).fillColor(INK).text(text, MARGIN.left, this.doc.y, { width: this.contentWidth });
    if (subtitle) this.doc.moveDown(0.2).font("Body").fontSize(11).fillColor(SOFT).text(subtitle, { width: this.contentWidth });
    this.doc.moveDown(1).font("Body").fontSize(10).fillColor(INK);
  }

  /** A section heading, kept on the same page as the first lines under it. */
  heading(text: string): void {
    this.keepTogether(70);
    this.doc.moveDown(0.6);
    this.doc.font("Bold").fontSize(14).fillColor(INK).text(text, MARGIN.left, this.doc.y, { width: this.contentWidth });
    const y = this.doc.y + 2;
    this.doc
      .moveTo(MARGIN.left, y)
      .lineTo(MARGIN.left + this.contentWidth, y)
      .lineWidth(0.5)
      .strokeColor(RULE)
      .stroke();
    this.doc.moveDown(0.5).font("Body").fontSize(10).fillColor(INK);
  }

  subheading(text: string): void {
    this.keepTogether(40);
    this.doc.moveDown(0.3);
    this.doc.font("Bold").fontSize(11).fillColor(INK).text(text, MARGIN.left, this.doc.y, { width: this.contentWidth });
    this.doc.moveDown(0.2).font("Body").fontSize(10);
  }

  /** Wrapped text; a label (e.g. "Internal, staff only") is set in bold before it. */
  paragraph(text: string, opts: { label?: string; soft?: boolean; size?: number } = {}): void {
    const size = opts.size ?? 10;
    this.doc.font("Body").fontSize(size);
    const body = opts.label ? `${opts.label}: ${text}` : text;
    this.keepTogether(Math.min(this.doc.heightOfString(body, { width: this.contentWidth }), 3 * size * 1.3));
    this.doc.x = MARGIN.left;
    if (opts.label) {
      this.doc.font("Bold").fillColor(INK).text(`${opts.label}: `, { width: this.contentWidth, continued: true });
    }
    this.doc
      .font("Body")
      .fillColor(opts.soft ? SOFT : INK)
      .text(text, { width: this.contentWidth });
    this.doc.fillColor(INK).moveDown(0.4);
  }

  /** Label–value pairs, one a line, the value wrapping beside its label. */
  facts(rows: readonly (readonly [string, string])[]): void {
    this.table(
      [
        { header: "", width: 0.3 },
        { header: "", width: 0.7 },
      ],
      rows,
      { headerRow: false },
    );
  }

  /** A table whose rows wrap their cells and break across pages (the header row repeated). */
  table(columns: readonly TableColumn[], rows: readonly (readonly string[])[], opts: { headerRow?: boolean } = {}): void {
    const doc = this.doc;
    const widths = columns.map((c) => c.width * this.contentWidth);
    const pad = 2;
    const heightOf = (cells: readonly string[], font: string) => {
      doc.font(font).fontSize(9);
      return Math.max(...cells.map((cell, i) => doc.heightOfString(cell || " ", { width: widths[i]! - 2 * pad }))) + 2 * pad;
    };
    const drawRow = (cells: readonly string[], font: string, shade: boolean) => {
      const h = heightOf(cells, font);
      const top = doc.y;
      if (shade) doc.rect(MARGIN.left, top, this.contentWidth, h).fillColor("#f0f4f8").fill();
      let x = MARGIN.left;
      cells.forEach((cell, i) => {
        doc
          .font(font)
          .fontSize(9)
          .fillColor(INK)
          .text(cell, x + pad, top + pad, { width: widths[i]! - 2 * pad });
        x += widths[i]!;
      });
      doc
        .moveTo(MARGIN.left, top + h)
        .lineTo(MARGIN.left + this.contentWidth, top + h)
        .lineWidth(0.3)
        .strokeColor(RULE)
        .stroke();
      doc.x = MARGIN.left;
      doc.y = top + h;
    };
    const header = opts.headerRow === false ? null : columns.map((c) => c.header);
    const labelFirst = opts.headerRow === false;
    if (header) {
      this.keepTogether(heightOf(header, "Bold") + (rows[0] ? heightOf(rows[0], "Body") : 0));
      drawRow(header, "Bold", true);
    }
    for (const row of rows) {
      const h = heightOf(row, "Body");
      if (h > this.roomLeft) {
        doc.addPage();
        if (header) drawRow(header, "Bold", true);
      }
      if (labelFirst) {
        // A label column in bold, the value in the body face.
        const top = doc.y;
        drawRow(["", row[1] ?? ""], "Body", false);
        const end = doc.y;
        doc
          .font("Bold")
          .fontSize(9)
          .text(row[0] ?? "", MARGIN.left + pad, top + pad, { width: widths[0]! - 2 * pad });
        doc.x = MARGIN.left;
        doc.y = end;
      } else {
        drawRow(row, "Body", false);
      }
    }
    doc.font("Body").fontSize(10).moveDown(0.6);
  }

  /**
   * A line chart drawn with paths. Each series is thinned to the lowest and highest value in each
   * column of the plot's width, which draws the same picture as every point would.
   */
  lineChart(opts: LineChartOptions): void {
    const doc = this.doc;
    const height = opts.height ?? 200;
    const legendHeight = 14 * Math.ceil(opts.series.length / 3);
    this.keepTogether(height + legendHeight + 50);
    doc.font("Bold").fontSize(10).text(opts.title, MARGIN.left, doc.y, { width: this.contentWidth });
    doc.moveDown(0.3);
    const left = MARGIN.left + 36;
    const top = doc.y + 4;
    const width = this.contentWidth - 40;
    const all = opts.series.flatMap((s) => s.points);
    const thresholds = opts.thresholds ?? [];
    if (all.length === 0) {
      doc.font("Body").fontSize(10).text("No readings to draw.", MARGIN.left, top);
      doc.moveDown(0.6);
      return;
    }
    let minX = Infinity;
    let maxX = -Infinity;
    let minY = Infinity;
    let maxY = -Infinity;
    for (const p of all) {
      minX = Math.min(minX, p.x);
      maxX = Math.max(maxX, p.x);
      minY = Math.min(minY, p.y);
      maxY = Math.max(maxY, p.y);
    }
    for (const t of thresholds) {
      minY = Math.min(minY, t.y);
      maxY = Math.max(maxY, t.y);
    }
    if (maxX === minX) maxX = minX + 1;
    const spanY = maxY - minY || 1;
    minY -= spanY * 0.05;
    maxY += spanY * 0.05;
    const py = (y: number) => top + height - ((y - minY) / (maxY - minY)) * height;

    // Axes and five labelled values up the side.
    doc.lineWidth(0.5).strokeColor(SOFT);
    doc
      .moveTo(left, top)
      .lineTo(left, top + height)
      .lineTo(left + width, top + height)
      .stroke();
    doc.font("Body").fontSize(7).fillColor(SOFT);
    const decimals = maxY - minY < 10 ? 1 : 0;
    for (let i = 0; i <= 4; i++) {
      const v = minY + ((maxY - minY) * i) / 4;
      doc.text(v.toFixed(decimals), MARGIN.left, py(v) - 3, { width: 32, align: "right", lineBreak: false });
      doc
        .moveTo(left, py(v))
        .lineTo(left + width, py(v))
        .lineWidth(0.2)
        .strokeColor(RULE)
        .stroke();
    }
    doc.text(opts.formatX(minX), left, top + height + 3, { width: 120, lineBreak: false });
    doc.text(opts.formatX(maxX), left + width - 120, top + height + 3, { width: 120, align: "right", lineBreak: false });
    doc.save().rotate(-90, { origin: [MARGIN.left - 8, top + height / 2] });
    doc.text(opts.yLabel, MARGIN.left - 60, top + height / 2 - 8, { width: 120, align: "center", lineBreak: false });
    doc.restore();

    for (const t of thresholds) {
      doc
        .moveTo(left, py(t.y))
        .lineTo(left + width, py(t.y))
        .dash(4, { space: 3 })
        .lineWidth(0.8)
        .strokeColor("#9b2c2c")
        .stroke()
        .undash();
      doc
        .fontSize(7)
        .fillColor("#9b2c2c")
        .text(t.label, left + 4, py(t.y) - 9, { width: width - 8, lineBreak: false });
    }

    doc.save().rect(left, top, width, height).clip();
    for (const s of opts.series) {
      const columns = Math.max(1, Math.round(width));
      const lows = new Array<number>(columns).fill(Infinity);
      const highs = new Array<number>(columns).fill(-Infinity);
      for (const p of s.points) {
        const c = Math.min(columns - 1, Math.floor(((p.x - minX) / (maxX - minX)) * columns));
        lows[c] = Math.min(lows[c]!, p.y);
        highs[c] = Math.max(highs[c]!, p.y);
      }
      let started = false;
      for (let c = 0; c < columns; c++) {
        if (lows[c] === Infinity) continue;
        const x = left + c + 0.5;
        if (!started) {
          doc.moveTo(x, py(lows[c]!));
          started = true;
        } else doc.lineTo(x, py(lows[c]!));
        if (highs[c] !== lows[c]) doc.lineTo(x, py(highs[c]!));
      }
      if (started) doc.lineWidth(0.8).strokeColor(s.colour).stroke();
    }
    doc.restore();

    // Legend.
    let lx = left;
    let ly = top + height + 16;
    for (const s of opts.series) {
      if (lx > left + width - 150) {
        lx = left;
        ly += 14;
      }
      doc
        .rect(lx, ly + 2, 10, 3)
        .fillColor(s.colour)
        .fill();
      doc
        .font("Body")
        .fontSize(8)
        .fillColor(INK)
        .text(s.label, lx + 14, ly - 1, { width: 150, lineBreak: false });
      lx += 170;
    }
    doc.x = MARGIN.left;
    doc.y = ly + 18;
    doc.font("Body").fontSize(10).fillColor(INK);
  }

  /**
   * A photo as large as the rest of the page allows under its caption, its aspect ratio kept (never
   * cropped). `data` is JPEG or PNG bytes; the caption lines are set above it. Call newPage() first
   * for a page of its own.
   */
  photoPage(data: Buffer, size: { width: number; height: number }, caption: readonly string[]): void {
    const doc = this.doc;
    doc
      .font("Bold")
      .fontSize(11)
      .text(caption[0] ?? "", MARGIN.left, doc.y, { width: this.contentWidth });
    doc.font("Body").fontSize(9).fillColor(SOFT);
    for (const line of caption.slice(1)) doc.text(line, { width: this.contentWidth });
    doc.fillColor(INK).moveDown(0.5);
    const boxW = this.contentWidth;
    const boxH = this.bottom - doc.y;
    const scale = Math.min(boxW / size.width, boxH / size.height);
    const w = size.width * scale;
    const h = size.height * scale;
    doc.image(data, MARGIN.left + (boxW - w) / 2, doc.y, { width: w, height: h });
    doc.x = MARGIN.left;
    doc.y = doc.y + h;
  }

  /** Attaches a file to the PDF (readers list it under attachments; `pdfdetach` extracts it). */
  attach(data: Buffer, name: string, description: string, type: string): void {
    this.doc.file(data, { name, description, type, creationDate: this.options.createdAt, modifiedDate: this.options.createdAt });
  }

  get pageCount(): number {
    return this.doc.bufferedPageRange().count;
  }

  /** Writes each page's header and footer ("Page X of Y") and ends the document. */
  finish(footerLines: readonly string[]): void {
    const doc = this.doc;
    const { start, count } = doc.bufferedPageRange();
    for (let i = start; i < start + count; i++) {
      doc.switchToPage(i);
      // Outside the margins: nothing here may start a new page.
      const margins = doc.page.margins;
      doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };
      doc.font("Bold").fontSize(8).fillColor(SOFT);
      doc.text(this.options.organisationName, MARGIN.left, 30, { width: this.contentWidth / 2, lineBreak: false });
      doc.font("Body").text(this.options.title, MARGIN.left + this.contentWidth / 2, 30, {
        width: this.contentWidth / 2,
        align: "right",
        lineBreak: false,
      });
      doc
        .moveTo(MARGIN.left, 44)
        .lineTo(MARGIN.left + this.contentWidth, 44)
        .lineWidth(0.3)
        .strokeColor(RULE)
        .stroke();
      const footerTop = A4.height - MARGIN.bottom + 18;
      doc
        .moveTo(MARGIN.left, footerTop - 6)
        .lineTo(MARGIN.left + this.contentWidth, footerTop - 6)
        .lineWidth(0.3)
        .strokeColor(RULE)
        .stroke();
      doc.font("Body").fontSize(7).fillColor(SOFT);
      footerLines.forEach((line, n) => {
        doc.text(line, MARGIN.left, footerTop + n * 10, { width: this.contentWidth - 70, lineBreak: false });
      });
      doc.text(`Page ${i - start + 1} of ${count}`, MARGIN.left + this.contentWidth - 70, footerTop, {
        width: 70,
        align: "right",
        lineBreak: false,
      });
      doc.page.margins = margins;
    }
    doc.end();
  }
}
