// A landlord's asset register, row by row, into our homes: which column feeds which field (from the
// header names), the register's wording mapped onto the vocabularies the risk engine reads
// (`wallElement`/`glazingElement` in home-elements.ts), a merged address split into its parts, and
// each row's verdict with reasons a person can act on. Pure: the server streams the file through it.
import type { GlazingKind, WallKind } from "./home-elements.js";
import { isUkPostcode, normalisePostcode, readPostcode, UPRN } from "./postcode.js";

export type BuiltFormKind = "detached" | "semi-detached" | "end-terrace" | "mid-terrace" | "flat" | "maisonette" | "bungalow";
export type HeatingKind = "gas-boiler" | "electric-storage" | "electric-direct" | "heat-pump" | "district" | "other" | "none";
export type VentilationKind =
  | "not-recorded"
  | "windows-only"
  | "trickle-vents"
  | "extract-fans"
  | "trickle-vents-and-fans"
  | "continuous-extract"
  | "piv"
  | "mvhr";
export type RoomKindName = "bedroom" | "living" | "kitchen" | "bathroom" | "other";

export const WALL_INSULATIONS = ["none", "cavity-fill", "external", "internal"] as const;
export type WallInsulation = (typeof WALL_INSULATIONS)[number];
export const HEATING_FUELS = ["mains-gas", "electricity", "oil", "lpg", "biomass", "solid-fuel", "district-heat"] as const;
export type HeatingFuel = (typeof HEATING_FUELS)[number];
export const EPC_BANDS = ["A", "B", "C", "D", "E", "F", "G"] as const;
export type EpcBand = (typeof EPC_BANDS)[number];

/** The fields a register column can feed, in the order the preview lists them. */
export const STOCK_FIELDS = [
  "uprn",
  "address",
  "addressLine1",
  "addressLine2",
  "town",
  "postcode",
  "estate",
  "block",
  "builtForm",
  "yearBuilt",
  "wallConstruction",
  "wallInsulation",
  "glazing",
  "roofInsulation",
  "heating",
  "heatingFuel",
  "extractFans",
  "trickleVents",
  "ventilation",
  "floorArea",
  "epcBand",
  "rooms",
] as const;
export type StockField = (typeof STOCK_FIELDS)[number];
/** Column number (0 is the first) for each field found; a field without a column is absent. */
export type StockMapping = Partial<Record<StockField, number>>;

/** Header names (lower case, letters and digits only, any bracketed unit dropped) that mean each field. */
const SYNONYMS: Record<StockField, readonly string[]> = {
  uprn: ["uprn", "uniquepropertyreferencenumber", "propertyuprn", "osuprn"],
  address: ["address", "fulladdress", "propertyaddress", "addressfull"],
  addressLine1: ["address1", "addressline1", "addr1", "line1", "street", "streetaddress", "houseandstreet"],
  addressLine2: ["address2", "addressline2", "addr2", "line2"],
  town: ["town", "city", "towncity", "posttown", "locality"],
  postcode: ["postcode", "postcodes", "postalcode", "pcode"],
  estate: ["estate", "estatename", "scheme", "schemename"],
  block: ["block", "blockname", "building", "buildingname"],
  builtForm: ["builtform", "propertytype", "dwellingtype", "archetype", "propertyform"],
  yearBuilt: [
    "yearbuilt",
    "builtyear",
    "constructionyear",
    "ageband",
    "constructionageband",
    "propertyage",
    "dateofconstruction",
    "yearorageband",
  ],
  wallConstruction: ["wallconstruction", "walltype", "walls", "wall", "externalwalls", "externalwallconstruction"],
  wallInsulation: ["wallinsulation", "wallinsulationtype", "externalwallinsulation"],
  glazing: ["glazing", "glazingtype", "windows", "windowtype", "windowglazing"],
  roofInsulation: ["roofinsulation", "loftinsulation", "loftinsulationdepth", "roofloftinsulation", "roofandloftinsulation"],
  heating: ["heating", "heatingtype", "mainheating", "heatingsystem", "mainheatingsystem"],
  heatingFuel: ["heatingfuel", "fuel", "mainfuel", "fueltype", "mainheatingfuel"],
  extractFans: ["extractfans", "extractfan", "extractors", "extractorfans"],
  trickleVents: ["tricklevents", "tricklevent"],
  ventilation: ["ventilation", "ventilationsystem", "mechanicalventilation", "pivmvhr", "ventilationtype"],
  floorArea: ["floorarea", "totalfloorarea", "grossinternalarea", "gia", "floorspace"],
  epcBand: ["epcband", "epc", "epcrating", "energyrating", "currentenergyrating", "currentepcband"],
  rooms: ["rooms", "roomlist", "roomnames"],
};

const headerKey = (header: string) =>
  header
    .replace(/\(.*?\)|\[.*?\]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]/g, "");

/**
 * Which column feeds which field, from the header names. The first column whose name matches wins; a
 * merged address column is kept only when there is no first-line column (separate columns are better).
 */
export function proposeStockMapping(headers: readonly string[]): StockMapping {
  const mapping: StockMapping = {};
  headers.forEach((h, i) => {
    const key = headerKey(h);
    if (!key) return;
    for (const field of STOCK_FIELDS) {
      if (mapping[field] === undefined && SYNONYMS[field].includes(key)) {
        mapping[field] = i;
        return;
      }
    }
  });
  if (mapping.addressLine1 !== undefined) delete mapping.address;
  return mapping;
}

/** What an admin must map before an import can run. */
export function missingStockFields(mapping: StockMapping): string[] {
  const missing: string[] = [];
  if (mapping.uprn === undefined) missing.push("the UPRN column (homes are matched by their UPRN)");
  if (mapping.addressLine1 === undefined && mapping.address === undefined) missing.push("an address column");
  return missing;
}

const lower = (v: string) => v.toLowerCase().replace(/[–—]/g, "-").replace(/\s+/g, " ").trim();

export function builtFormFrom(text: string): BuiltFormKind | null {
  const t = lower(text);
  if (/semi/.test(t)) return "semi-detached";
  if (/end[\s-]*(of[\s-]*)?terr/.test(t)) return "end-terrace";
  if (/maisonette/.test(t)) return "maisonette";
  if (/bungalow/.test(t)) return "bungalow";
  if (/flat|apartment|bedsit|studio/.test(t)) return "flat";
  if (/terr/.test(t)) return "mid-terrace";
  if (/detached/.test(t)) return "detached";
  return null;
}

const UNINSULATED = /unfilled|un-filled|not filled|empty|as built|no insulation|uninsulated|un-insulated|none/;

/**
 * The wall, from the construction and (if the register has it apart) the insulation. A cavity with
 * nothing said about its fill is taken as unfilled: the colder surface, so the estimate errs toward
 * risk (common practice, no source).
 */
export function wallFrom(construction: string, insulation = ""): WallKind | null {
  const c = lower(construction);
  const i = lower(insulation);
  const both = `${c} ${i}`;
  const insulated = !UNINSULATED.test(i) && /insulat|ewi|iwi|external|internal|dry.?lin|fill|cwi/.test(i);
  if (/timber/.test(c)) return "timber-frame";
  if (/system|non.?trad|prefab|pre-?cast|concrete panel|no.?fines|airey|reema|wimpey|pcc/.test(c)) return "system-built";
  if (/cavity/.test(c)) {
    if (UNINSULATED.test(both)) return "unfilled-cavity";
    if (/fill|insulat|cwi/.test(both)) return "filled-cavity";
    return "unfilled-cavity";
  }
  if (/solid|brick|stone|granite|sandstone|limestone/.test(c)) {
    if ((!UNINSULATED.test(c) && /insulat|ewi|iwi/.test(c)) || insulated) return "insulated";
    return /stone|granite|sandstone|limestone/.test(c) ? "solid-stone" : "solid-brick";
  }
  if (!UNINSULATED.test(c) && /insulat|ewi|iwi/.test(c)) return "insulated";
  return null;
}

export function wallInsulationFrom(construction: string, insulation = ""): WallInsulation | null {
  const text = lower(insulation || construction);
  if (!text) return null;
  if (UNINSULATED.test(text)) return "none";
  if (/external|ewi/.test(text)) return "external";
  if (/internal|iwi|dry.?lin/.test(text)) return "internal";
  if (/fill|cwi|cavity.*insulat|insulat.*cavity/.test(text)) return "cavity-fill";
  if (insulation && /^(no|n)$/.test(text)) return "none";
  return null;
}

/** Double glazing with no date is taken as the older kind: the colder pane (common practice, no source). */
export function glazingFrom(text: string): GlazingKind | null {
  const t = lower(text);
  if (/triple/.test(t)) return "triple";
  if (/mixed|partial|part /.test(t)) return "mixed";
  if (/single/.test(t)) return "single";
  if (/double|dg\b|upvc|secondary/.test(t)) {
    if (/pre.?2002|before 2002|old/.test(t)) return "old-double";
    if (/post.?2002|after 2002|2002 or later|modern|a.?rated|low.?e|new|20[0-2]\d/.test(t)) return "modern-double";
    return "old-double";
  }
  return null;
}

export function heatingFuelFrom(text: string): HeatingFuel | null {
  const t = lower(text);
  if (!t) return null;
  if (/lpg|bottled|propane/.test(t)) return "lpg";
  if (/district|communal|heat network/.test(t)) return "district-heat";
  if (/heat pump|ashp|gshp|air source|ground source/.test(t)) return "electricity";
  if (/\boil\b|kerosene/.test(t)) return "oil";
  if (/gas/.test(t)) return "mains-gas";
  if (/electric|economy.?7|storage/.test(t)) return "electricity";
  if (/biomass|wood|pellet/.test(t)) return "biomass";
  if (/coal|solid fuel|anthracite/.test(t)) return "solid-fuel";
  return null;
}

export function heatingFrom(text: string, fuel: HeatingFuel | null): HeatingKind | null {
  const t = lower(text);
  if (!t) return null;
  if (/^(none|no heating|no central heating)$/.test(t)) return "none";
  if (/heat pump|ashp|gshp|air source|ground source/.test(t)) return "heat-pump";
  if (/district|communal|heat network/.test(t)) return "district";
  if (/storage|economy.?7/.test(t)) return "electric-storage";
  if (/boiler|combi|central heating|condensing|back boiler|wet system/.test(t)) {
    const boilerFuel = fuel ?? heatingFuelFrom(t);
    return boilerFuel === null || boilerFuel === "mains-gas" ? "gas-boiler" : "other";
  }
  if (/electric|panel|convector|direct/.test(t)) return "electric-direct";
  if (/fire|stove|oil|lpg|biomass|solid/.test(t)) return "other";
  return null;
}

/** Yes/no (or a count) from a register cell; null when the cell says neither. */
export function presenceFrom(text: string): boolean | null {
  const t = lower(text);
  if (!t) return null;
  if (/^(y|yes|true|present|fitted|installed|some|all)\b/.test(t)) return true;
  if (/^(n|no|none|false|absent|not fitted|0)\b/.test(t)) return false;
  const n = Number(t.replace(/[^\d.]/g, ""));
  if (/^\d/.test(t) && Number.isFinite(n)) return n > 0;
  if (/kitchen|bathroom|wc|utility/.test(t)) return true;
  return null;
}

/** The ventilation, from a system column and the fans and trickle-vents columns. */
export function ventilationFrom(system: string, fans: boolean | null, trickle: boolean | null): VentilationKind | null {
  const t = lower(system);
  if (/mvhr|heat recovery/.test(t)) return "mvhr";
  if (/piv|positive input/.test(t)) return "piv";
  if (/continuous|dmev|\bmev\b|cmev|whole.?house extract/.test(t)) return "continuous-extract";
  const sysTrickle = /trickle/.test(t) ? true : null;
  const sysFans = /fan|extract/.test(t) ? true : null;
  const hasTrickle = trickle ?? sysTrickle;
  const hasFans = fans ?? sysFans;
  if (hasTrickle && hasFans) return "trickle-vents-and-fans";
  if (hasFans) return "extract-fans";
  if (hasTrickle) return "trickle-vents";
  if (hasFans === false && hasTrickle === false) return "windows-only";
  if (/natural|windows? only|opening windows/.test(t)) return "windows-only";
  return null;
}

export interface YearOrBand {
  year: number | null;
  band: string | null;
}

/** "1965" → the year; "1945-1964", "1945 to 1964", "pre 1919", "2012 onwards" → an age band, written "1945-1964", "before 1919", "2012 onwards". */
export function yearOrBandFrom(text: string, thisYear: number): YearOrBand | null {
  const t = lower(text);
  const ok = (y: number) => y >= 1500 && y <= thisYear;
  let m = /^(\d{4})(?:\.0+)?$/.exec(t);
  if (m) return ok(+m[1]) ? { year: +m[1], band: null } : null;
  m = /^(\d{4})\s*(?:-|to|–)\s*(\d{4})$/.exec(t);
  if (m) return ok(+m[1]) && +m[2] >= +m[1] && +m[2] <= thisYear + 1 ? { year: null, band: `${m[1]}-${m[2]}` } : null;
  m = /^(?:pre|before|<)\s*-?\s*(\d{4})$/.exec(t);
  if (m) return ok(+m[1]) ? { year: null, band: `before ${m[1]}` } : null;
  m = /^(?:post|after|>)\s*-?\s*(\d{4})$|^(\d{4})\s*(?:onwards|\+|and later|or later)$/.exec(t);
  if (m) {
    const y = +(m[1] ?? m[2]);
    return ok(y) ? { year: null, band: `${y} onwards` } : null;
  }
  return null;
}

/** Millimetres of roof or loft insulation: "270mm", "270", "None" (0), "> 300 mm" (300). */
export function roofInsulationMmFrom(text: string): number | null {
  const t = lower(text);
  if (!t) return null;
  if (/^(none|no|nil|0|uninsulated)\b/.test(t)) return 0;
  const m = /^[<>≥≤]?\s*(\d{1,3}(?:\.\d+)?)\s*(mm|millimetres?)?$/.exec(t);
  if (m) return Math.round(Number(m[1]));
  const inches = /^(\d{1,2}(?:\.\d+)?)\s*(?:in|inch|inches|")$/.exec(t);
  if (inches) return Math.round(Number(inches[1]) * 25.4);
  return null;
}

const SQ_FT_IN_M2 = 0.09290304; // exact by definition of the international foot (from memory)
/** Square metres; square feet converted when the cell or the header says so. */
export function floorAreaFrom(text: string, header = ""): number | null {
  const t = lower(text).replace(/,/g, "");
  const m = /^(\d+(?:\.\d+)?)\s*(m2|m²|sq\.? ?m|sqm|square metres?|ft2|ft²|sq\.? ?ft|sqft|square feet)?$/.exec(t);
  if (!m) return null;
  const feet = /ft|feet/.test(m[2] ?? "") || (!m[2] && /ft|feet/.test(lower(header)));
  const m2 = Number(m[1]) * (feet ? SQ_FT_IN_M2 : 1);
  if (m2 < 5 || m2 > 5000) return null;
  return Math.round(m2 * 10) / 10;
}

export function epcBandFrom(text: string): EpcBand | null {
  const m = /^(?:band\s*)?([a-g])(?:\b|\d)/i.exec(text.trim());
  return m ? (m[1].toUpperCase() as EpcBand) : null;
}

export function roomKindFrom(name: string): RoomKindName {
  const t = lower(name);
  if (/bed/.test(t)) return "bedroom";
  if (/kitchen/.test(t)) return "kitchen";
  if (/bath|shower|wc|toilet|cloak/.test(t)) return "bathroom";
  if (/living|lounge|sitting|dining|reception|front room/.test(t)) return "living";
  return "other";
}

/** "Bedroom 1; Kitchen; Bathroom" (or | or , between them) → the rooms, each named once. */
export function roomsFrom(text: string): { name: string; kind: RoomKindName }[] {
  const seen = new Set<string>();
  const out: { name: string; kind: RoomKindName }[] = [];
  for (const part of text.split(/[;|,\n]/)) {
    const name = part.trim().replace(/\s+/g, " ").slice(0, 100);
    if (!name || seen.has(name.toLowerCase())) continue;
    seen.add(name.toLowerCase());
    out.push({ name, kind: roomKindFrom(name) });
  }
  return out.slice(0, 30);
}

export interface AddressParts {
  addressLine1: string;
  addressLine2: string | null;
  town: string;
  postcode: string | null;
}

/**
 * "12 Elm Road, Flat 3, Leeds, LS1 4AB" → line 1, line 2, town and postcode. The postcode is the last
 * part (or the end of it: "Leeds LS1 4AB"); the town is the part before it; line 2 is what lies between.
 */
export function splitAddress(text: string): AddressParts | null {
  const parts = text
    .split(/[,\n]/)
    .map((p) => p.trim())
    .filter(Boolean);
  let postcode: string | null = null;
  const last = parts[parts.length - 1] ?? "";
  if (isUkPostcode(last)) {
    postcode = normalisePostcode(last);
    parts.pop();
  } else {
    const m = /^(.*?)\s+([A-Za-z]{1,2}\d[A-Za-z\d]?\s*\d[A-Za-z]{2})$/.exec(last);
    if (m && isUkPostcode(m[2])) {
      postcode = normalisePostcode(m[2]);
      parts[parts.length - 1] = m[1].trim();
    } else if (parts.length > 2 && /\d/.test(last) && /^[A-Za-z\d ]{5,9}$/.test(last)) {
      // Shaped like a postcode but not one: kept, so the row is refused for its postcode, not its town.
      postcode = last;
      parts.pop();
    }
  }
  if (parts.length < 2) return null;
  const town = parts.pop()!;
  const addressLine1 = parts.shift()!;
  return { addressLine1, addressLine2: parts.length ? parts.join(", ") : null, town, postcode };
}

/** The street of "12 Elm Road" or "Flat 3 12 Elm Road": the estate of a home on no estate. */
export function streetOf(line1: string): string {
  const street = line1
    .replace(/^(flat|apartment|apt|unit|room)\s+\S+[,\s]+/i, "")
    .replace(/^\d+[a-z]?(-\d+[a-z]?)?[,\s]+/i, "")
    .trim();
  return street || line1;
}

/**
 * A register repeats the same few words in every row ("Cavity – filled", "Gas combi boiler"): each
 * reading is worked out once per distinct text (or pair of texts). The caches are bounded, so a file of
 * all-different values costs memory for no more than MEMO_LIMIT of them.
 */
const MEMO_LIMIT = 5_000;
function memo<R>(fn: (key: string) => R): (key: string) => R {
  const cache = new Map<string, R>();
  return (key) => {
    const hit = cache.get(key);
    if (hit !== undefined || cache.has(key)) return hit as R;
    const value = fn(key);
    if (cache.size >= MEMO_LIMIT) cache.clear();
    cache.set(key, value);
    return value;
  };
}
/** memo() for a reading of two texts, without joining them into a key on every call. */
function memo2<R>(fn: (a: string, b: string) => R): (a: string, b: string) => R {
  const outer = new Map<string, (b: string) => R>();
  return (a, b) => {
    let inner = outer.get(a);
    if (inner === undefined) {
      if (outer.size >= MEMO_LIMIT) outer.clear();
      inner = memo((bb) => fn(a, bb));
      outer.set(a, inner);
    }
    return inner(b);
  };
}
const cached = {
  builtForm: memo(builtFormFrom),
  glazing: memo(glazingFrom),
  fuel: memo(heatingFuelFrom),
  roof: memo(roofInsulationMmFrom),
  presence: memo(presenceFrom),
  epc: memo(epcBandFrom),
  wall: memo2(wallFrom),
  wallInsulation: memo2(wallInsulationFrom),
  heating: memo2((text, fuel) => heatingFrom(text, (fuel || null) as HeatingFuel | null)),
};

/** A home as a register row describes it; null is "the register does not say" (an update keeps what we hold). */
export interface StockHome {
  uprn: string;
  addressLine1: string;
  addressLine2: string | null;
  town: string;
  postcode: string;
  estate: string;
  block: string | null;
  builtForm: BuiltFormKind | null;
  wallType: WallKind | null;
  glazingType: GlazingKind | null;
  heatingType: HeatingKind | null;
  ventilation: VentilationKind | null;
  builtYear: number | null;
  ageBand: string | null;
  wallInsulation: WallInsulation | null;
  roofInsulationMm: number | null;
  heatingFuel: HeatingFuel | null;
  hasExtractFans: boolean | null;
  hasTrickleVents: boolean | null;
  floorAreaM2: number | null;
  epcBand: EpcBand | null;
}

/** The fields the risk engine needs: a new home is refused without them. */
export const ENGINE_FIELDS = ["builtForm", "wallType", "glazingType", "heatingType"] as const;

export type ConvertedStockRow =
  | { ok: true; home: StockHome; rooms: { name: string; kind: RoomKindName }[]; notes: string[] }
  | { ok: false; uprn: string; reasons: string[] };

const MAX = { addressLine1: 190, addressLine2: 190, town: 100, estate: 100, block: 100 } as const;

/** The fields whose length the database limits, with the words a reason uses. */
const LENGTHS = [
  ["addressLine1", "first line of address"],
  ["addressLine2", "second line"],
  ["town", "town"],
  ["estate", "estate"],
  ["block", "block"],
] as const;

/**
 * One register row (cells as text) into a home or the reasons it cannot be one. Values the risk engine
 * needs and that we cannot read refuse the row (the admin fixes the file or the mapping); other details
 * we cannot read are left empty and noted. For many rows of one file, stockRowConverter does the
 * per-file work once.
 */
export function convertStockRow(
  cells: readonly string[],
  mapping: StockMapping,
  headers: readonly string[],
  thisYear: number,
): ConvertedStockRow {
  return stockRowConverter(mapping, headers, thisYear)(cells);
}

/** convertStockRow for the rows of one file: the mapping, the floor area's unit and this year are read once. */
export function stockRowConverter(
  mapping: StockMapping,
  headers: readonly string[],
  thisYear: number,
): (cells: readonly string[]) => ConvertedStockRow {
  const col = (f: StockField) => mapping[f] ?? -1;
  const c = {
    uprn: col("uprn"),
    address: mapping.addressLine1 === undefined ? col("address") : -1,
    addressLine1: col("addressLine1"),
    addressLine2: col("addressLine2"),
    town: col("town"),
    postcode: col("postcode"),
    estate: col("estate"),
    block: col("block"),
    builtForm: col("builtForm"),
    yearBuilt: col("yearBuilt"),
    wallConstruction: col("wallConstruction"),
    wallInsulation: col("wallInsulation"),
    glazing: col("glazing"),
    roofInsulation: col("roofInsulation"),
    heating: col("heating"),
    heatingFuel: col("heatingFuel"),
    extractFans: col("extractFans"),
    trickleVents: col("trickleVents"),
    ventilation: col("ventilation"),
    floorArea: col("floorArea"),
    epcBand: col("epcBand"),
    rooms: col("rooms"),
  };
  const floorHeader = mapping.floorArea === undefined ? "" : (headers[mapping.floorArea] ?? "");
  const yearOrBand = memo((t) => yearOrBandFrom(t, thisYear));
  const floorArea = memo((t) => floorAreaFrom(t, floorHeader));

  return (cells) => {
    const cell = (i: number) => (i < 0 ? "" : (cells[i] ?? "").trim());
    let reasons: string[] | null = null;
    const refuse = (reason: string) => (reasons ??= []).push(reason);
    const notes: string[] = [];

    const uprnText = cell(c.uprn);
    let uprn = UPRN.test(uprnText) ? uprnText : uprnText.replace(/\s+/g, "").replace(/\.0+$/, "");
    if (!uprn) refuse("No UPRN: homes are matched by their UPRN.");
    else if (!UPRN.test(uprn)) refuse(`UPRN "${uprnText}" is not a number of up to 12 digits.`);
    else if (uprn.charCodeAt(0) === 48 /* 0 */) uprn = uprn.replace(/^0+(?=\d)/, "");

    let line1 = cell(c.addressLine1);
    let line2: string | null = cell(c.addressLine2) || null;
    let town = cell(c.town);
    let postcodeText = cell(c.postcode);
    let addressUnsplit = false;
    if (c.address >= 0) {
      const merged = cell(c.address);
      const parts = merged ? splitAddress(merged) : null;
      if (merged && !parts) {
        refuse(`The address "${merged}" could not be split into a first line and a town.`);
        addressUnsplit = true;
      }
      if (parts) {
        line1 = parts.addressLine1;
        line2 = parts.addressLine2;
        town = town || parts.town;
        postcodeText = postcodeText || (parts.postcode ?? "");
      }
    }
    if (!line1 && !addressUnsplit) refuse("No first line of address.");
    if (!town && line1) refuse("No town.");
    let postcode = "";
    if (!postcodeText) refuse("No postcode.");
    else {
      const read = readPostcode(postcodeText);
      if (read === null) refuse(`Postcode "${postcodeText}" is not a UK postcode.`);
      else postcode = read;
    }

    const block = cell(c.block) || null;
    const estate = cell(c.estate) || (line1 ? streetOf(line1) : "");
    const values = { addressLine1: line1, addressLine2: line2 ?? "", town, estate, block: block ?? "" };
    for (const [field, label] of LENGTHS) {
      if (values[field].length > MAX[field]) refuse(`The ${label} is longer than ${MAX[field]} characters.`);
    }

    const builtFormText = cell(c.builtForm);
    const builtForm = builtFormText ? cached.builtForm(builtFormText) : null;
    if (builtFormText && builtForm === null) refuse(`Built form "${builtFormText}" is not one we recognise.`);
    const wallText = cell(c.wallConstruction);
    const wallInsulationText = cell(c.wallInsulation);
    const wallType = wallText ? cached.wall(wallText, wallInsulationText) : null;
    if (wallText && wallType === null) refuse(`Wall construction "${wallText}" is not one we recognise.`);
    const glazingText = cell(c.glazing);
    const glazingType = glazingText ? cached.glazing(glazingText) : null;
    if (glazingText && glazingType === null) refuse(`Glazing "${glazingText}" is not one we recognise.`);
    const fuelText = cell(c.heatingFuel);
    let heatingFuel = fuelText ? cached.fuel(fuelText) : null;
    if (fuelText && heatingFuel === null) notes.push(`Heating fuel "${fuelText}" not recognised: left empty.`);
    const heatingText = cell(c.heating);
    const heatingType = heatingText ? cached.heating(heatingText, heatingFuel ?? "") : null;
    if (heatingText && heatingType === null) refuse(`Heating "${heatingText}" is not one we recognise.`);
    if (heatingFuel === null && !fuelText && heatingText) heatingFuel = cached.fuel(heatingText);

    const optional = <T>(text: string, label: string, value: T | null): T | null => {
      if (text && value === null) notes.push(`${label} "${text}" not recognised: left empty.`);
      return value;
    };
    const yearText = cell(c.yearBuilt);
    const built = optional(yearText, "Year built", yearText ? yearOrBand(yearText) : null);
    const wallInsulation = wallInsulationText
      ? optional(wallInsulationText, "Wall insulation", cached.wallInsulation(wallText, wallInsulationText))
      : wallType === "filled-cavity"
        ? "cavity-fill"
        : wallType === "unfilled-cavity" && /fill|insulat/.test(lower(wallText))
          ? "none"
          : null;
    const roofText = cell(c.roofInsulation);
    const roofInsulationMm = optional(roofText, "Roof insulation", roofText ? cached.roof(roofText) : null);
    const fansText = cell(c.extractFans);
    const hasExtractFans = optional(fansText, "Extract fans", fansText ? cached.presence(fansText) : null);
    const trickleText = cell(c.trickleVents);
    const hasTrickleVents = optional(trickleText, "Trickle vents", trickleText ? cached.presence(trickleText) : null);
    const ventText = cell(c.ventilation);
    let ventilation = ventilationFrom(ventText, hasExtractFans, hasTrickleVents);
    if (ventText && ventilation === null) {
      notes.push(`Ventilation "${ventText}" not recognised: left as it was.`);
      ventilation = null;
    }
    const areaText = cell(c.floorArea);
    const floorAreaM2 = optional(areaText, "Floor area", areaText ? floorArea(areaText) : null);
    const epcText = cell(c.epcBand);
    const epcBand = optional(epcText, "EPC band", epcText ? cached.epc(epcText) : null);
    const roomsText = cell(c.rooms);
    const rooms = roomsText ? roomsFrom(roomsText) : [];

    if (reasons !== null) return { ok: false, uprn: uprnText, reasons };
    return {
      ok: true,
      home: {
        uprn,
        addressLine1: line1,
        addressLine2: line2,
        town,
        postcode,
        estate,
        block,
        builtForm,
        wallType,
        glazingType,
        heatingType,
        ventilation,
        builtYear: built?.year ?? null,
        ageBand: built?.band ?? null,
        wallInsulation,
        roofInsulationMm,
        heatingFuel,
        hasExtractFans,
        hasTrickleVents,
        floorAreaM2,
        epcBand,
      },
      rooms,
      notes,
    };
  };
}

/** What a new home still lacks for the risk engine, in words ("built form", "walls"…). */
export function missingEngineFields(home: StockHome): string[] {
  const words: Record<(typeof ENGINE_FIELDS)[number], string> = {
    builtForm: "built form",
    wallType: "wall construction",
    glazingType: "glazing",
    heatingType: "heating",
  };
  return ENGINE_FIELDS.filter((f) => home[f] === null).map((f) => words[f]);
}
