// The report's steps, in order, and which form fields each one checks before moving on.
import type { FieldPath } from "react-hook-form";
import type { ReportFormValues } from "./draft";

export type FieldName = FieldPath<ReportFormValues>;

/** `title` is the step's key in the `report` namespace (report:steps.<title>). */
export const STEPS: { title: "describe" | "extent" | "home" | "photos" | "readings" | "check"; fields: FieldName[] }[] = [
  { title: "describe", fields: ["description", "locations", "observations", "roomIds"] },
  { title: "extent", fields: ["since", "area"] },
  { title: "home", fields: ["equipment", "vulnerability"] },
  { title: "photos", fields: [] },
  { title: "readings", fields: [] },
  { title: "check", fields: [] },
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
