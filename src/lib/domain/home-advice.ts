// Advice for one home: from the home's record (walls, glazing, heating, ventilation) and the case's
// facts (readings, rooms, the tenant's answers), the few things most likely to help there, ranked.
// Pure: no I/O. Every item names its source beside it, or says it is common practice with no source.
// Wording is plain English for tenants; repairs, fans and insulation are the landlord's job, never the tenant's.
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

export interface AdviceItem {
  id: AdviceId;
  title: string;
  whatToDo: string;
  /** Why it helps in this home, tied to the home's own facts. */
  why: string;
  cost: CostBand;
  cautions: string[];
  /** Where the rule comes from, or "Common practice, no source". */
  source: string;
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

const COMMON_PRACTICE = "Common practice, no source";
const TRADES = "Gas and electrical work is only for qualified trades, following local rules.";

const UNINSULATED_WALLS: readonly WallKind[] = ["solid-brick", "solid-stone", "unfilled-cavity"];
const COLD_GLAZING: readonly GlazingKind[] = ["single", "mixed"];
const RADIATOR_HEATING: readonly AdviceHeating[] = ["gas-boiler", "heat-pump", "district"];
const WET = new Set<SurfaceState>(["condensing", "mould-risk"]);
const NOT_WORKING = new Set<AdviceAnswer>(["no", "sometimes"]);

const wallWords: Record<WallKind, string> = {
  "solid-brick": "solid brick walls",
  "solid-stone": "solid stone walls",
  "unfilled-cavity": "cavity walls that are not filled",
  "filled-cavity": "filled cavity walls",
  "system-built": "system-built walls",
  "timber-frame": "timber frame walls",
  insulated: "insulated walls",
};

// Approximate surface temperatures at 20 °C inside and 0 °C outside, from TRADE.md §2's typical
// U-values [M, from memory] with fRsi ≈ 1 − U·Rsi [D].
const SURFACE_NOTE = "ISO 13788 (surface temperature factor); typical U-values from memory";

export const NO_OVEN_FOR_WARMTH: AdviceItem = {
  id: "no-oven-for-warmth",
  title: "Never heat a room with an oven, hob or bottled gas heater",
  whatToDo:
    "Do not use the oven, a gas hob, or a bottled gas or paraffin heater to keep warm. If the heating does not work, tell your landlord.",
  why: "They can give off carbon monoxide, a gas you cannot see or smell that can kill. They can start a fire. Gas and paraffin heaters also put a lot of water into the air.",
  cost: "free",
  cautions: [
    "If you feel dizzy, sick or have a headache at home, get fresh air and call for help.",
    "A carbon monoxide alarm is a good idea near any gas appliance.",
    TRADES,
  ],
  source: COMMON_PRACTICE,
};

interface Candidate {
  item: AdviceItem;
  score: number;
}

/** The few things most likely to help in this home, ranked, with the safety caution always beside them. */
export function adviseForHome(f: HomeAdviceFacts): HomeAdvice {
  const wet = f.riskState !== null && WET.has(f.riskState);
  const uninsulatedWalls = UNINSULATED_WALLS.includes(f.wallType);
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
        title: "Heating that works is your landlord's job",
        whatToDo:
          f.heatingType === "none"
            ? "Your home has no fixed heating on our record. Tell your landlord: they should provide a safe way to heat the home."
            : "Tell your landlord the heating does not always work. Fixing it is their job, not yours.",
        why: "A home that stays cold has cold walls and windows, and water from the air settles on cold surfaces.",
        cost: "landlords-job",
        cautions: [TRADES, "Do not try to repair a boiler or heater yourself."],
        source: COMMON_PRACTICE,
      },
    });

  if ((fanBroken || noFans) && wetRooms)
    candidates.push({
      score: 90,
      item: {
        id: "fan-repair",
        title: "A working extractor fan is your landlord's job",
        whatToDo: fanBroken
          ? "Tell your landlord the extractor fan in the kitchen or bathroom is missing or does not work well. Fitting or fixing it is their job."
          : "Our record shows no extractor fan. Ask your landlord about fitting one in the kitchen and bathroom.",
        why: "Cooking and washing put a lot of water into the air. A fan takes it outside before it settles on cold walls.",
        cost: "landlords-job",
        cautions: [TRADES],
        source: "Approved Document F (England, 2021) Vol. 1 extract rates: kitchen 30–60 l/s, bathroom 15 l/s",
      },
    });

  if (leakSigns && !wet)
    candidates.push({
      score: 85,
      item: {
        id: "possible-leak",
        title: "Wet patches may need a surveyor",
        whatToDo:
          "Tell your landlord about any wet patch or leak. They should send someone qualified to find where the water comes from.",
        why:
          f.riskState === null
            ? "Wet patches can come from a leak or from damp getting in, not only from condensation."
            : "The readings do not show condensation on this surface, so the water may come from a leak or from damp getting in.",
        cost: "landlords-job",
        cautions: [
          "Keep away from wet electrics. If water is near lights or sockets, switch off at the fuse box if it is safe and call for help.",
        ],
        source: COMMON_PRACTICE,
      },
    });

  if (!heatingBroken) {
    const controls =
      f.heatingType === "electric-storage"
        ? "Set the storage heaters so they give out a little heat all day, rather than none and then a lot."
        : RADIATOR_HEATING.includes(f.heatingType)
          ? "Use the radiator valves to keep every room a little warm, and set the thermostat to the lowest setting you are comfortable with."
          : "Set the heating to the lowest setting you are comfortable with, and keep it on steadily.";
    const cold = [uninsulatedWalls ? wallWords[f.wallType] : null, coldGlass ? "single glazing" : null]
      .filter(Boolean)
      .join(" and ");
    candidates.push({
      score: 60 + (wet ? 20 : 0) + (uninsulatedWalls ? 5 : 0) + (coldGlass ? 5 : 0),
      item: {
        id: "steady-low-heat",
        title: "Steady, low warmth rather than none",
        whatToDo: `${controls} Keep rooms you use less a little warm too, with the door closed.`,
        why: `${cold ? `Your home has ${cold}, which get cold. ` : ""}Warm surfaces stay drier: water from the air settles on the coldest surfaces first.${hardToAfford ? " We know heating costs money. There is help with costs below." : ""}`,
        cost: "free",
        cautions: ["Older people, babies and people who are ill need more warmth: do not let them get cold."],
        source: COMMON_PRACTICE,
      },
    });
  }

  if (condensation || wet)
    candidates.push({
      score: 55 + (wet ? 15 : 0),
      item: {
        id: "wipe-and-air",
        title: "Let the damp air out",
        whatToDo:
          "Keep trickle vents open. Run the extractor fan while cooking or washing and for a while after. Wipe water off windows in the morning.",
        why:
          f.riskState === "condensing"
            ? "The readings show water settling on a cold surface in your home. Moving damp air out helps while your landlord looks at the cause."
            : "Water on windows and walls feeds mould. This helps while your landlord looks at the cause.",
        cost: "free",
        cautions: [
          "If you clean mould, wear gloves, a mask and eye protection and open a window. Do not clean mould if you have asthma, allergies or a weak immune system, are pregnant, or for children. Bleach does not fix it.",
        ],
        source: COMMON_PRACTICE,
      },
    });

  if (coldGlass)
    candidates.push({
      score: 50 + (wet || condensation ? 10 : 0),
      item: {
        id: "window-film",
        title: "Clear window film on single glazing, if your landlord agrees",
        whatToDo:
          "Ask your landlord first. If they agree, fit a clear film kit inside the window frame. Leave trickle vents and opening windows uncovered.",
        why: "Your home has single glazing. The glass is the coldest surface in the room, about 5–7 °C when it is 0 °C outside and 20 °C inside, so water settles there first. Film adds a layer of still air.",
        cost: "under-20",
        cautions: ["Film does not replace repairs: rotten frames or broken glass are the landlord's job."],
        source: SURFACE_NOTE,
      },
    });

  if (uninsulatedWalls && RADIATOR_HEATING.includes(f.heatingType))
    candidates.push({
      score: 45 + (wet ? 5 : 0),
      item: {
        id: "radiator-reflector",
        title: "Reflector panels behind radiators on outside walls",
        whatToDo:
          "Fit foil reflector panels on the wall behind radiators that sit on an outside wall. Ask your landlord before you stick anything to the walls.",
        why: `Your home has ${wallWords[f.wallType]}, which lose heat quickly (about 9.5 °C inside face at 0 °C out for solid brick). A panel sends heat back into the room.`,
        cost: "under-20",
        cautions: ["Do not cover the radiator valve or the thermostat.", "Insulating the walls is the landlord's job."],
        source: `${SURFACE_NOTE}; the panels themselves: common practice, no source`,
      },
    });

  if (coldGlass || uninsulatedWalls || f.glazingType === "old-double")
    candidates.push({
      score: 40,
      item: {
        id: "draught-proofing",
        title: "Stop draughts, but never block a vent",
        whatToDo:
          "Brush or foam strips on doors and window gaps stop cold draughts. Ask your landlord first for anything fixed to windows.",
        why: "Cold draughts chill walls and windows. Vents are different: they let damp air out on purpose.",
        cost: "under-20",
        cautions: [
          "Never block trickle vents, air bricks or extractor fans.",
          "Do not seal rooms with a gas fire or boiler that needs air.",
        ],
        source: COMMON_PRACTICE,
      },
    });

  const order = (id: AdviceId) => ADVICE_IDS.indexOf(id as (typeof ADVICE_IDS)[number]);
  const items = candidates
    .sort((a, b) => b.score - a.score || order(a.item.id) - order(b.item.id))
    .slice(0, MAX_ADVICE_ITEMS)
    .map((c) => c.item);
  return { items, safety: NO_OVEN_FOR_WARMTH, offerSupportRoute: hardToAfford };
}
