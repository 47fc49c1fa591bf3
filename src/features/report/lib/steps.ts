// The report's steps, in order, and which form fields each one checks before moving on.
import type { FieldPath } from "react-hook-form";
import type { ReportFormValues } from "./draft";

export type FieldName = FieldPath<ReportFormValues>;

export const STEPS: { title: string; fields: FieldName[] }[] = [
  { title: "What you can see, and where", fields: ["description", "locations", "observations", "roomIds"] },
  { title: "How long, and how big", fields: ["since", "area"] },
  { title: "About your home and household", fields: ["equipment", "vulnerability"] },
  { title: "Photos", fields: [] },
  { title: "Readings", fields: [] },
  { title: "Check and send", fields: [] },
];
export const PHOTOS_STEP = 3;
export const READINGS_STEP = 4;
export const LAST_STEP = STEPS.length - 1;

const belongsTo = (field: string, f: string) => field === f || field.startsWith(`${f}.`);

/** True when some step asks for this field (a server error names it). */
export const isStepField = (field: string) => STEPS.some((s) => s.fields.some((f) => belongsTo(field, f)));

/** The step that asks for a field, or the first step. */
export function stepOfField(field: string): number {
  const i = STEPS.findIndex((s) => s.fields.some((f) => belongsTo(field, f)));
  return i === -1 ? 0 : i;
}
