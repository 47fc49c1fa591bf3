/**
 * Pseudo-localisation: every letter of a translated string swapped for an accented look-alike, the
 * string lengthened by a third (Welsh and German run longer than English) and wrapped in ⟦ ⟧. Text on
 * a page without the brackets did not pass through translation. Placeholders were filled in before this
 * runs, so values such as an address are transformed too; that is harmless for a test language.
 */
const ACCENTED: Record<string, string> = {
  a: "á",
  b: "ƀ",
  c: "ç",
  d: "ð",
  e: "é",
  f: "ƒ",
  g: "ĝ",
  h: "ĥ",
  i: "í",
  j: "ĵ",
  k: "ķ",
  l: "ļ",
  m: "ɱ",
  n: "ñ",
  o: "ó",
  p: "þ",
  q: "ǫ",
  r: "ŕ",
  s: "š",
  t: "ţ",
  u: "ú",
  v: "ṽ",
  w: "ŵ",
  x: "ẋ",
  y: "ý",
  z: "ž",
  A: "Á",
  B: "Ɓ",
  C: "Ç",
  D: "Ð",
  E: "É",
  F: "Ƒ",
  G: "Ĝ",
  H: "Ĥ",
  I: "Í",
  J: "Ĵ",
  K: "Ķ",
  L: "Ļ",
  M: "Ṁ",
  N: "Ñ",
  O: "Ó",
  P: "Þ",
  Q: "Ǫ",
  R: "Ŕ",
  S: "Š",
  T: "Ţ",
  U: "Ú",
  V: "Ṽ",
  W: "Ŵ",
  X: "Ẋ",
  Y: "Ý",
  Z: "Ž",
};

export const PSEUDO_OPEN = "⟦";
export const PSEUDO_CLOSE = "⟧";

export function pseudoLocalise(text: string, rtl = false): string {
  if (text === "") return text;
  const accented = text.replace(/[A-Za-z]/g, (c) => ACCENTED[c] ?? c);
  const padding = "~".repeat(Math.ceil(text.length / 3));
  // U+202E (right-to-left override) … U+202C (pop) makes the pseudo-RTL string read right to left even
  // inside left-to-right text, so a layout that ignores `dir` shows up at once.
  const body = rtl ? `\u202e${accented}\u202c` : accented;
  return `${PSEUDO_OPEN}${body}${padding}${PSEUDO_CLOSE}`;
}
