// The report of rejected rows: CSV "row,reason", capped so a file of a million bad rows stays small.

/** Most rejected rows listed in a report; the last line then says how many more there were. */
export const REPORT_MAX_ROWS = 10_000;

const csvField = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

export class RejectedReport {
  private readonly lines: string[] = [];
  private readonly first: { row: number; reason: string }[] = [];
  count = 0;

  constructor(private readonly maxRows = REPORT_MAX_ROWS) {}

  add(row: number, reason: string): void {
    this.count++;
    if (this.first.length < 5) this.first.push({ row, reason });
    if (this.lines.length < this.maxRows) this.lines.push(`${row},${csvField(reason)}`);
  }

  /** The first few rejections, for an error's details. */
  get firstRejections(): { row: number; reason: string }[] {
    return this.first;
  }

  /** CSV text with a header line; null when nothing was rejected. */
  toCsv(): string | null {
    if (this.count === 0) return null;
    const more = this.count - this.lines.length;
    const tail = more > 0 ? [`,${csvField(`…and ${more} more rejected rows, not listed`)}`] : [];
    return ["row,reason", ...this.lines, ...tail].join("\n") + "\n";
  }
}
