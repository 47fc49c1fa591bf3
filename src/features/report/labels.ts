// Plain words for every value a damp or mould report stores (src/lib/schemas/case-report.ts). The
// stored values are for machines; the words live in the `report` namespace (src/locales/<lng>/report.json),
// so a tenant reads them in their language and staff read the same words in English.
import type { TFunction } from "i18next";
import { EQUIPMENT_ANSWERS, HEATING_COST_ANSWERS } from "@/lib/schemas/case-report";

export interface Choice<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

/** The groups of stored values that have words in report.json. */
export type LabelGroup = "location" | "observation" | "duration" | "area" | "vulnerability";

/** The three questions about the home's equipment: facts about the home, asked neutrally. */
export const EQUIPMENT_QUESTIONS = ["heatingUsable", "extractorFanWorks", "trickleVentsOpen"] as const;
export type EquipmentQuestion = (typeof EQUIPMENT_QUESTIONS)[number];

/** A stored value in words; falls back to the value itself, so one added on the server still shows something. */
export function labelFor(t: TFunction, group: LabelGroup, value: string | null | undefined): string {
  if (!value) return "";
  return t(`report:${group}.${value}`, { defaultValue: value });
}

export const choices = <V extends string>(t: TFunction, group: LabelGroup, values: readonly V[]): Choice<V>[] =>
  values.map((value) => ({ value, label: labelFor(t, group, value) }));

/** One equipment question (or the optional one about the cost of heating), its hint and its answers in words. */
export function equipmentQuestion(t: TFunction, q: EquipmentQuestion | "heatingCost") {
  const answers: readonly string[] = q === "heatingCost" ? HEATING_COST_ANSWERS : EQUIPMENT_ANSWERS;
  return {
    question: t(`report:equipment.${q}.question`),
    hint: t(`report:equipment.${q}.hint`),
    answer: (value: string | null | undefined) =>
      value ? t(`report:equipment.${q}.answers.${value}`, { defaultValue: value }) : "",
    choices: answers.map((value) => ({ value, label: t(`report:equipment.${q}.answers.${value}`) })),
  };
}
