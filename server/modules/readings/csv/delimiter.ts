// Which character separates the fields: tab, semicolon or comma.
export const DELIMITERS = [",", ";", "\t"] as const;
export type Delimiter = (typeof DELIMITERS)[number];

/** Occurrences of `ch` outside double quotes. */
function countOutsideQuotes(line: string, ch: string): number {
  let count = 0;
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') quoted = !quoted;
    else if (c === ch && !quoted) count++;
  }
  return count;
}

/**
 * Looks at up to 50 non-empty lines. A candidate qualifies when most lines (60 %, leaving room
 * for notes above the header) hold the same non-zero number of it. Tab is tried first, then
 * semicolon, then comma: a semicolon file with decimal commas has as many commas as semicolons
 * on a line, but a comma file rarely has semicolons on every line. Falls back to the comma.
 */
export function detectDelimiter(text: string): Delimiter {
  const lines = text
    .split(/\r\n|\n|\r/)
    .filter((l) => l.trim() !== "")
    .slice(0, 50);
  if (lines.length === 0) return ",";
  for (const ch of ["\t", ";", ","] as const) {
    const counts = new Map<number, number>();
    for (const line of lines) {
      const n = countOutsideQuotes(line, ch);
      counts.set(n, (counts.get(n) ?? 0) + 1);
    }
    let mode = 0;
    let modeLines = 0;
    for (const [n, k] of counts) if (k > modeLines || (k === modeLines && n > mode)) [mode, modeLines] = [n, k];
    if (mode >= 1 && modeLines >= Math.ceil(lines.length * 0.6)) return ch;
  }
  return ",";
}
