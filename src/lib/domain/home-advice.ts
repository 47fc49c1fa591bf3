// Advice for one home: from the home's record (walls, glazing, heating, ventilation) and the case's
// facts (readings, rooms, the tenant's answers), the few things most likely to help there, ranked.
// Pure: no I/O. Every item names its source beside it, or says it is common practice with no source.
// The words are the client's, per language (src/locales/<lng>/advice.json), chosen by each item's id and
// facts; repairs, fans and insulation are the landlord's job, never the tenant's.
import type { GlazingKind, WallKind } from "./home-elements.js";
import type { SurfaceState } from "./surface.js";

export type AdviceHeating = "gas-boiler" | "electric-storage" | "electric-direct" | "heat-pump" | "district" | "other" | "none";
export type AdviceVentilation =
  | "not-recorded"
  | "windows-only"
  | "trickle-vents"
  | "extract-fans"
  | "trickle-vents-and-fans"
  | "continuous-extract"
  | "piv"
  | "mvhr";
export type AdviceRoomKind = "bedroom" | "living" | "kitchen" | "bathroom" | "other";
export type AdviceAnswer = "yes" | "no" | "sometimes" | "not-sure" | "none-fitted";
/** The tenant's optional answer about the cost of heating; asked without blame, never required. */
export const HEATING_COST_ANSWERS = ["manageable", "hard-to-afford", "rather-not-say"] as const;
export type HeatingCostAnswer = (typeof HEATING_COST_ANSWERS)[number];

export interface HomeAdviceFacts {
  wallType: WallKind;
  glazingType: GlazingKind;
  heatingType: AdviceHeating;
  ventilation: AdviceVentilation;
  /** The rooms the case is about (or the home's rooms when none were named). */
  roomKinds: readonly AdviceRoomKind[];
  /** The risk engine's worst surface state; null while there are no readings. */
  riskState: SurfaceState | null;
  /** What the tenant noticed (condensation, leak, …). */
  observations: readonly string[];
  heatingUsable?: AdviceAnswer | null;
  extractorFanWorks?: AdviceAnswer | null;
  heatingCost?: HeatingCostAnswer | null;
}

export const ADVICE_IDS = [
  "heating-repair",
  "fan-repair",
  "possible-leak",
  "steady-low-heat",
  "wipe-and-air",
  "window-film",
  "radiator-reflector",
  "draught-proofing",
] as const;
export type AdviceId = (typeof ADVICE_IDS)[number] | "no-oven-for-warmth";

/** Rough bands only (common practice, no source): a tenant's outlay, or none because it is the landlord's job. */
export type CostBand = "free" | "under-20" | "20-to-100" | "landlords-job";

/** The cautions an item may carry; their words live with the tenant's text (src/locales/<lng>/advice.json). */
export const ADVICE_CAUTIONS = [
  "trades",
  "no-diy-heating-repair",
  "wet-electrics",
  "keep-vulnerable-warm",
  "mould-cleaning",
  "film-not-repair",
  "reflector-valves",
  "walls-landlords-job",
  "never-block-vents",
  "gas-appliance-air",
  "co-symptoms",
  "co-alarm",
] as const;
export type AdviceCaution = (typeof ADVICE_CAUTIONS)[number];

/**
 * Where an item comes from, named beside it: "common-practice" (no source), Approved Document F
 * (England, 2021) Vol. 1 extract rates, or ISO 13788's surface temperature factor with typical
 * U-values from memory ("iso-13788", "iso-13788-panels" when the panels themselves are common practice).
 */
export const ADVICE_SOURCES = ["common-practice", "approved-document-f", "iso-13788", "iso-13788-panels"] as const;
export type AdviceSource = (typeof ADVICE_SOURCES)[number];

/**
 * One thing that may help. The domain decides what and why; the words are the client's, per language,
 * chosen by `id` and filled from `facts` (ICU select values such as `heating: "storage"`), so this
 * code stays free of any one language.
 */
export interface AdviceItem {
  id: AdviceId;
  /** The home's facts the item's wording picks from (whatToDo and why), tied to the home's own record. */
  facts: AdviceFacts;
  cost: CostBand;
  cautions: AdviceCaution[];
  source: AdviceSource;
}

/** Every value is a word for an ICU select; "none" means the fact does not apply. */
export interface AdviceFacts {
  /** heating-repair: no fixed heating at all, or heating that does not always work. */
  heating?: "none" | "unreliable" | "storage" | "radiators" | "other";
  /** fan-repair: the fan is missing or broken, or the record shows none. */
  fan?: "broken" | "not-recorded";
  /** possible-leak, wipe-and-air: what the readings show. */
  readings?: "none" | "dry" | "condensing" | "other";
  /** The home's walls when they are uninsulated (and get cold), else "none". */
  walls?: UninsulatedWall | "none";
  /** "single" when single or partly single glazed, else "none". */
  glass?: "single" | "none";
  /** The tenant said heating is hard to afford: the warmth tip points to the help below. */
  costs?: "hard" | "ok";
}

export interface HomeAdvice {
  /** Ranked, most helpful first; at most MAX_ADVICE_ITEMS. */
  items: AdviceItem[];
  /** Always shown, whatever the home: never heat a room with an oven, hob or unflued heater. */
  safety: AdviceItem;
  /** The tenant said heating is hard to afford: show the landlord's support route. */
  offerSupportRoute: boolean;
}

export const MAX_ADVICE_ITEMS = 4;

export const UNINSULATED_WALLS = ["solid-brick", "solid-stone", "unfilled-cavity"] as const satisfies readonly WallKind[];
export type UninsulatedWall = (typeof UNINSULATED_WALLS)[number];
const isUninsulated = (wall: WallKind): wall is UninsulatedWall => (UNINSULATED_WALLS as readonly WallKind[]).includes(wall);
const COLD_GLAZING: readonly GlazingKind[] = ["single", "mixed"];
const RADIATOR_HEATING: readonly AdviceHeating[] = ["gas-boiler", "heat-pump", "district"];
const WET = new Set<SurfaceState>(["condensing", "mould-risk"]);
const NOT_WORKING = new Set<AdviceAnswer>(["no", "sometimes"]);

// The surface temperatures the window-film and reflector wording quote (about 5–7 °C on single glazing,
// about 9.5 °C on the inside face of solid brick, at 20 °C inside and 0 °C outside) are from TRADE.md §2's
// typical U-values [M, from memory] with fRsi ≈ 1 − U·Rsi [D]: source "iso-13788".

export const NO_OVEN_FOR_WARMTH: AdviceItem = {
  id: "no-oven-for-warmth",
  facts: {},
  cost: "free",
  cautions: ["co-symptoms", "co-alarm", "trades"],
  source: "common-practice",
};

interface Candidate {
  item: AdviceItem;
  score: number;
}

/** The few things most likely to help in this home, ranked, with the safety caution always beside them. */
export function adviseForHome(f: HomeAdviceFacts): HomeAdvice {
  const wet = f.riskState !== null && WET.has(f.riskState);
  const walls = isUninsulated(f.wallType) ? f.wallType : null;
  const uninsulatedWalls = walls !== null;
  const coldGlass = COLD_GLAZING.includes(f.glazingType);
  const heatingBroken = f.heatingType === "none" || (f.heatingUsable != null && NOT_WORKING.has(f.heatingUsable));
  const hardToAfford = f.heatingCost === "hard-to-afford";
  const wetRooms = f.roomKinds.some((k) => k === "kitchen" || k === "bathroom");
  const noFans = f.ventilation === "windows-only" || f.ventilation === "trickle-vents";
  const fanBroken =
    f.extractorFanWorks != null && (NOT_WORKING.has(f.extractorFanWorks) || f.extractorFanWorks === "none-fitted");
  const condensation = f.observations.includes("condensation");
  const leakSigns = f.observations.includes("leak") || f.observations.includes("wet-patches");
  const candidates: Candidate[] = [];

  if (heatingBroken)
    candidates.push({
      score: 100,
      item: {
        id: "heating-repair",
        facts: { heating: f.heatingType === "none" ? "none" : "unreliable" },
        cost: "landlords-job",
        cautions: ["trades", "no-diy-heating-repair"],
        source: "common-practice",
      },
    });

  if ((fanBroken || noFans) && wetRooms)
    candidates.push({
      score: 90,
      item: {
        id: "fan-repair",
        facts: { fan: fanBroken ? "broken" : "not-recorded" },
        cost: "landlords-job",
        cautions: ["trades"],
        source: "approved-document-f",
      },
    });

  if (leakSigns && !wet)
    candidates.push({
      score: 85,
      item: {
        id: "possible-leak",
        facts: { readings: f.riskState === null ? "none" : "dry" },
        cost: "landlords-job",
        cautions: ["wet-electrics"],
        source: "common-practice",
      },
    });

  if (!heatingBroken)
    candidates.push({
      score: 60 + (wet ? 20 : 0) + (uninsulatedWalls ? 5 : 0) + (coldGlass ? 5 : 0),
      item: {
        id: "steady-low-heat",
        facts: {
          heating:
            f.heatingType === "electric-storage" ? "storage" : RADIATOR_HEATING.includes(f.heatingType) ? "radiators" : "other",
          walls: walls ?? "none",
          glass: coldGlass ? "single" : "none",
          costs: hardToAfford ? "hard" : "ok",
        },
        cost: "free",
        cautions: ["keep-vulnerable-warm"],
        source: "common-practice",
      },
    });

  if (condensation || wet)
    candidates.push({
      score: 55 + (wet ? 15 : 0),
      item: {
        id: "wipe-and-air",
        facts: { readings: f.riskState === "condensing" ? "condensing" : "other" },
        cost: "free",
        cautions: ["mould-cleaning"],
        source: "common-practice",
      },
    });

  if (coldGlass)
    candidates.push({
      score: 50 + (wet || condensation ? 10 : 0),
      item: {
        id: "window-film",
        facts: { glass: "single" },
        cost: "under-20",
        cautions: ["film-not-repair"],
        source: "iso-13788",
      },
    });

  if (uninsulatedWalls && RADIATOR_HEATING.includes(f.heatingType))
    candidates.push({
      score: 45 + (wet ? 5 : 0),
      item: {
        id: "radiator-reflector",
        facts: { walls: walls ?? "none" },
        cost: "under-20",
        cautions: ["reflector-valves", "walls-landlords-job"],
        source: "iso-13788-panels",
      },
    });

  if (coldGlass || uninsulatedWalls || f.glazingType === "old-double")
    candidates.push({
      score: 40,
      item: {
        id: "draught-proofing",
        facts: {},
        cost: "under-20",
        cautions: ["never-block-vents", "gas-appliance-air"],
        source: "common-practice",
      },
    });

  const order = (id: AdviceId) => ADVICE_IDS.indexOf(id as (typeof ADVICE_IDS)[number]);
  const items = candidates
    .sort((a, b) => b.score - a.score || order(a.item.id) - order(b.item.id))
    .slice(0, MAX_ADVICE_ITEMS)
    .map((c) => c.item);
  return { items, safety: NO_OVEN_FOR_WARMTH, offerSupportRoute: hardToAfford };
}
