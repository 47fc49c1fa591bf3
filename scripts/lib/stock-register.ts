// A generated asset register for `npm run bench:stock`: homes on estates of blocks and streets, in a
// housing system's own wording (the import maps it onto our vocabularies), written in chunks so the
// file is never held in memory. Deterministic for a seed.
import { closeSync, openSync, writeSync } from "node:fs";
import { mulberry32 } from "../../server/lib/random.js";

export const REGISTER_HEADER = [
  "UPRN",
  "Address 1",
  "Address 2",
  "Town",
  "Post Code",
  "Estate",
  "Block",
  "Property Type",
  "Year Built",
  "Wall Construction",
  "Wall Insulation",
  "Glazing",
  "Loft Insulation",
  "Heating",
  "Fuel",
  "Extract Fans",
  "Trickle Vents",
  "Ventilation",
  "Floor Area (m²)",
  "EPC Rating",
];

const STREETS = ["Elm Road", "Oak Street", "Birch Close", "Cedar Way", "Larch Grove", "Pine Walk", "Rowan Avenue", "Hazel Drive"];
const TOWNS = ["Easterby", "Northwick", "Southam Vale", "Westmere"];
const FORMS = ["Flat", "Mid terrace house", "End terrace", "Semi-detached house", "Detached", "Maisonette", "Bungalow"];
const WALLS: [string, string][] = [
  ["Cavity", "Filled"],
  ["Cavity – filled", ""],
  ["Cavity", "As built, no insulation"],
  ["Solid brick", ""],
  ["Solid brick", "External wall insulation"],
  ["Stone", ""],
  ["System built (no-fines)", ""],
  ["Timber frame", ""],
];
const GLAZING = ["Double glazed (post 2002)", "Double glazed (pre 2002)", "Single glazed", "Triple glazed", "Mixed"];
const HEATING: [string, string][] = [
  ["Gas combi boiler", "Mains gas"],
  ["Gas condensing boiler", "Mains gas"],
  ["Electric storage heaters", "Electricity"],
  ["Air source heat pump", "Electricity"],
  ["Communal heating", "District heat network"],
];
const VENT = ["", "", "PIV", "MVHR", "Natural"];
const BANDS = ["pre 1919", "1919-1944", "1945-1964", "1965-1980", "1981-1990", "1991-2002", "2003 onwards"];

const quote = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** UPRN of the i-th home (12 digits). */
export const uprnOf = (i: number) => String(200000000000 + i);

/** The register's cells for home i; `changed` alters its glazing (the 1 % of a re-import). */
export function registerRow(i: number, seed: number, changed = false): string[] {
  const random = mulberry32(seed * 1_000_003 + i);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(random() * xs.length)]!;
  const street = pick(STREETS);
  const estateNo = Math.floor(i / 500);
  const flat = random() < 0.5;
  const [wall, insulation] = pick(WALLS);
  const [heating, fuel] = pick(HEATING);
  const year = random() < 0.5 ? String(1900 + Math.floor(random() * 120)) : pick(BANDS);
  let glazing = pick(GLAZING);
  if (changed) glazing = glazing === "Triple glazed" ? "Single glazed" : "Triple glazed";
  return [
    uprnOf(i),
    `${(i % 200) + 1} ${street}`,
    flat ? `Flat ${(i % 12) + 1}` : "",
    pick(TOWNS),
    `ZX${(i % 9) + 1} ${i % 10}${String.fromCharCode(65 + (i % 26))}${String.fromCharCode(65 + ((i >> 3) % 26))}`,
    `Estate ${estateNo}`,
    flat ? `Block ${i % 40}` : "",
    flat ? "Flat" : pick(FORMS),
    year,
    wall,
    insulation,
    glazing,
    pick(["270mm", "100mm", "None", "", "300"]),
    heating,
    fuel,
    pick(["Yes", "No", "2", ""]),
    pick(["Yes", "No", ""]),
    pick(VENT),
    (30 + random() * 90).toFixed(1),
    pick(["A", "B", "C", "C", "D", "D", "E", "F", "G", ""]),
  ];
}

/**
 * Writes `rows` homes to `file` as a register CSV (UTF-8, CRLF, comma-separated). Every
 * `changeEvery`-th home (if given) has its glazing changed. `each` sees every row's cells.
 */
export function writeRegister(
  file: string,
  rows: number,
  seed: number,
  options: { changeEvery?: number; each?: (cells: string[]) => void } = {},
): number {
  const fd = openSync(file, "w");
  let bytes = 0;
  let chunk: string[] = [REGISTER_HEADER.join(",")];
  const flush = () => {
    const text = chunk.join("\r\n") + "\r\n";
    bytes += writeSync(fd, text);
    chunk = [];
  };
  try {
    for (let i = 0; i < rows; i++) {
      const cells = registerRow(i, seed, options.changeEvery !== undefined && i % options.changeEvery === 0);
      options.each?.(cells);
      chunk.push(cells.map(quote).join(","));
      if (chunk.length >= 5_000) flush();
    }
    flush();
  } finally {
    closeSync(fd);
  }
  return bytes;
}
