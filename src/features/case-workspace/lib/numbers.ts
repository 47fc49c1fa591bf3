/** Accepts "19,5" as well as "19.5", and a typographic minus; undefined when empty, NaN when not a number. */
export function parseDecimal(text: string): number | undefined {
  const t = text.trim().replace(",", ".").replace("\u2212", "-");
  if (t === "") return undefined;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(t)) return Number.NaN;
  return Number(t);
}

/** "12.5, 13; 11.8" → [12.5, 13, 11.8]; NaN entries for anything that is not a number. */
export function parseDecimalList(text: string): number[] {
  return text
    .split(/[;\s]+|,(?=\s)|,$/)
    .map((part) => part.trim())
    .filter(Boolean)
    .map((part) => parseDecimal(part) ?? Number.NaN);
}

/** One decimal at most, without a trailing ".0": 95.4, 100, 0.1. */
export function tenthsText(value: number): string {
  const rounded = Math.round(value * 10) / 10;
  return Number.isInteger(rounded) ? String(rounded) : rounded.toFixed(1);
}
