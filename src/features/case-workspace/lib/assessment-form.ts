// The HHSRS assessment form: the four spread-of-harm boxes as typed, their running total, and the
// same checks the server makes (validateAssessment in src/lib/domain/hhsrs.ts), before sending.
import { HARM_CLASSES, LIKELIHOOD_POINTS, validateAssessment, type AssessmentProblem } from "@/lib/domain/hhsrs";
import type { AssessmentInput } from "../api/types";
import { parseDecimal } from "./numbers";

export interface AssessmentFields {
  likelihood: string;
  spread: [string, string, string, string];
  justification: string;
}

export interface AssessmentErrors {
  likelihood?: string;
  /** Per class I–IV. */
  spread: [string?, string?, string?, string?];
  /** Problems with the spread as a whole (the total, the representative points). */
  spreadTotal?: string;
  justification?: string;
}

/** An empty box counts as 0 %; a box that is not a number is left out of the total. */
export function spreadValues(spread: readonly string[]): (number | null)[] {
  return spread.map((text) => {
    const v = parseDecimal(text);
    if (v === undefined) return 0;
    return Number.isNaN(v) ? null : v;
  });
}

/** The running total of the spread, in tenths of a per cent to avoid 0.1 + 0.2 noise, shown as %. */
export function spreadTotal(spread: readonly string[]): number {
  const tenths = spreadValues(spread).reduce<number>((sum, v) => sum + (v === null ? 0 : Math.round(v * 10)), 0);
  return tenths / 10;
}

export const errorsFound = (e: AssessmentErrors): boolean =>
  Boolean(e.likelihood || e.spreadTotal || e.justification || e.spread.some(Boolean));

export function checkAssessment(fields: AssessmentFields): { input?: AssessmentInput; errors: AssessmentErrors } {
  const errors: AssessmentErrors = { spread: [] };
  const likelihood = fields.likelihood ? Number(fields.likelihood) : Number.NaN;
  const values = spreadValues(fields.spread);
  values.forEach((v, i) => {
    if (v === null) errors.spread[i] = `Class ${HARM_CLASSES[i]} must be a percentage, for example 21.5.`;
  });

  if (!fields.likelihood) errors.likelihood = "Choose the likelihood of a harmful occurrence.";
  // With no likelihood chosen yet the spread is still checked, so both problems show at once.
  const spread = values.map((v) => v ?? Number.NaN) as [number, number, number, number];
  const problems: AssessmentProblem[] = validateAssessment({
    likelihood: fields.likelihood ? likelihood : LIKELIHOOD_POINTS[0],
    spread,
  });
  for (const p of problems) {
    if (p.field === "likelihood") errors.likelihood ??= p.message;
    else if (p.index !== undefined) errors.spread[p.index] ??= p.message;
    else errors.spreadTotal ??= p.message;
  }

  const justification = fields.justification.trim();
  if (justification.length < 10) errors.justification = "Give the reasons for this judgement in a sentence or two.";
  else if (justification.length > 8000) errors.justification = "Keep the justification under 8,000 characters.";

  if (errorsFound(errors)) return { errors };
  return { input: { likelihood, spread: values as [number, number, number, number], justification }, errors };
}
