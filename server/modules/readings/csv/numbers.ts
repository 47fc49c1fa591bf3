// Numbers as loggers and spreadsheets write them: "20.5", "20,5" (with a semicolon or tab
// delimiter), "−3.2" with a real minus sign, and a unit stuck on: "20.5 °C", "68F", "55 %RH".

export type NumberUnit = "C" | "F" | "%" | null;

export interface ParsedNumber {
  value: number;
  /** The unit written in the cell, if any. */
  unit: NumberUnit;
}

const PLAIN = /^[+-]?(?:\d+\.?\d*|\.\d+)$/;
const UNIT = /\s*(?:°|º|deg(?:rees?)?)?\s*([CF])$|\s*(%\s*(?:rh)?|rh)$/i;

/**
 * The number in a cell, or null when it is not one. `decimalComma`: a comma is the decimal
 * separator (files delimited by semicolons or tabs); otherwise a comma makes it not a number.
 */
export function parseNumber(raw: string, decimalComma: boolean): ParsedNumber | null {
  if (PLAIN.test(raw)) return { value: Number(raw), unit: null };
  let text = raw.trim().replace(/^[−–]/, "-");
  let unit: NumberUnit = null;
  const u = UNIT.exec(text);
  if (u) {
    unit = u[1] ? (u[1].toUpperCase() as "C" | "F") : "%";
    text = text.slice(0, u.index).trim();
  }
  if (decimalComma && text.indexOf(",") !== -1 && text.indexOf(".") === -1) text = text.replace(",", ".");
  if (!PLAIN.test(text)) return null;
  return { value: Number(text), unit };
}

export const fahrenheitToCelsius = (f: number): number => ((f - 32) * 5) / 9;

/** Rounded to two decimals, as DECIMAL(5,2) stores it. */
export const round2 = (v: number): number => Math.round(v * 100) / 100;
