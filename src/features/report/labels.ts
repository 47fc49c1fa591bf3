// Plain words for every value a damp or mould report stores (src/lib/schemas/case-report.ts).
// The stored values are for machines; these are what people read.
import type {
  Area,
  Duration,
  EquipmentAnswer,
  HeatingCostAnswer,
  Location,
  Observation,
  Vulnerability,
} from "@/lib/schemas/case-report";

export interface Choice<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

export const locationLabels: Record<Location, string> = {
  window: "Window or window frame",
  "external-wall": "A wall that faces outside",
  ceiling: "Ceiling",
  corner: "A corner of the room",
  "behind-furniture": "Behind furniture or inside a wardrobe",
  floor: "Floor or skirting board",
  "bath-or-shower": "Around the bath or shower",
  other: "Somewhere else",
};

export const observationLabels: Record<Observation, string> = {
  condensation: "Water on the glass or sills",
  "mould-spots": "Black, green or grey spots (mould)",
  "musty-smell": "A musty or damp smell",
  "peeling-paint": "Peeling paint or wallpaper",
  "wet-patches": "Damp or wet patches on walls or ceilings",
  leak: "Water dripping or coming in",
};

export const durationLabels: Record<Duration, string> = {
  days: "A few days",
  weeks: "A few weeks",
  months: "A few months",
  "over-a-year": "More than a year",
  "not-sure": "I'm not sure",
};

export const areaLabels: Record<Area, string> = {
  hand: "About the size of a hand or smaller",
  a4: "About the size of a sheet of A4 paper",
  door: "About the size of a door",
  larger: "Bigger than a door",
};

export const vulnerabilityLabels: Record<Vulnerability, string> = {
  "children-under-15": "Children under 15",
  "over-65": "Someone aged 65 or over",
  "breathing-or-immune": "Someone with asthma, another breathing condition or a weakened immune system",
  pregnancy: "Someone who is pregnant",
  disability: "Someone with a disability or long-term illness",
};

/** The three questions about the home's equipment: facts about the home, asked neutrally. */
export const EQUIPMENT_QUESTIONS = ["heatingUsable", "extractorFanWorks", "trickleVentsOpen"] as const;
export type EquipmentQuestion = (typeof EQUIPMENT_QUESTIONS)[number];

export const equipmentQuestions: Record<
  EquipmentQuestion,
  { question: string; hint: string; answers: Record<EquipmentAnswer, string> }
> = {
  heatingUsable: {
    question: "Can the heating be used in this room?",
    hint: "For example, is there a radiator or heater here, and does it come on when it should?",
    answers: {
      yes: "Yes",
      no: "No",
      sometimes: "Only some of the time",
      "not-sure": "I'm not sure",
      "none-fitted": "There is no heating in this room",
    },
  },
  extractorFanWorks: {
    question: "Is there an extractor fan, and does it work?",
    hint: "Extractor fans are usually in kitchens and bathrooms.",
    answers: {
      yes: "Yes, there is one and it works",
      no: "There is one, but it does not work",
      sometimes: "It works only some of the time",
      "not-sure": "I'm not sure",
      "none-fitted": "There isn't one",
    },
  },
  trickleVentsOpen: {
    question: "Are there trickle vents on the windows, and can they be opened?",
    hint: "Trickle vents are small slots with a sliding cover, usually along the top of a window frame.",
    answers: {
      yes: "Yes, there are vents and they open",
      no: "There are vents, but they can't be opened",
      sometimes: "Some of them open",
      "not-sure": "I'm not sure",
      "none-fitted": "There aren't any",
    },
  },
};

/** About the cost of heating: optional, never a judgement; "hard to afford" brings the landlord's support route. */
export const heatingCostQuestion: { question: string; hint: string; answers: Record<HeatingCostAnswer, string> } = {
  question: "Is it hard to pay for heating at the moment?",
  hint: "Many people find heating costs hard. If you say yes, we will show you where your landlord can help. You don't have to answer.",
  answers: {
    manageable: "No, I can manage",
    "hard-to-afford": "Yes, it is hard to afford",
    "rather-not-say": "I'd rather not say",
  },
};

/** The household answer beyond the list itself: "none of these" is an empty list, "prefer not to say" is no answer. */
export const householdNoneLabel = "None of these";
export const householdPreferNotLabel = "I'd rather not say";

export const choices = <V extends string>(labels: Record<V, string>, values: readonly V[]): Choice<V>[] =>
  values.map((value) => ({ value, label: labels[value] }));

/** Falls back to the stored value, so a value added on the server still shows something. */
export function labelFor<V extends string>(labels: Record<V, string>, value: string | null | undefined): string {
  if (!value) return "";
  return (labels as Record<string, string>)[value] ?? value;
}
