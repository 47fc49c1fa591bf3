// The calculator form over the API's own schema: the fields arrive as text, so this layer only
// turns text into numbers (or "not given") and the API schema keeps the ranges and messages.
import type { TFunction } from "i18next";
import { z } from "zod";
import { evaluatePointSchema } from "@/lib/schemas/psychrometrics";
import type { ElementId } from "@/lib/domain";

/** Blank is "not given"; a decimal comma and a typographic minus are accepted; anything else becomes NaN for the schema to reject. */
export function numberFromText(value: string): number | undefined {
  const text = value.trim().replace(",", ".").replace("\u2212", "-");
  return text === "" ? undefined : Number(text);
}

const elementOrUndefined = (value: ElementId | "") => (value === "" ? undefined : value);

const shape = evaluatePointSchema.shape;

export const calculatorFormSchema = z.object({
  airTemperatureC: z.preprocess(numberFromText, shape.airTemperatureC),
  relativeHumidityPct: z.preprocess(numberFromText, shape.relativeHumidityPct),
  surfaceTemperatureC: z.preprocess(numberFromText, shape.surfaceTemperatureC),
  outdoorTemperatureC: z.preprocess(numberFromText, shape.outdoorTemperatureC),
  element: z.preprocess(elementOrUndefined, shape.element),
});

/** What the fields hold: text, and "" for "no element". */
export type CalculatorFormValues = z.input<typeof calculatorFormSchema>;
export type CalculatorField = keyof CalculatorFormValues;
/** What the engine gets: numbers, or nothing for a blank optional field. */
export type CalculatorInput = z.output<typeof calculatorFormSchema>;

export const EMPTY_FORM: CalculatorFormValues = {
  airTemperatureC: "",
  relativeHumidityPct: "",
  surfaceTemperatureC: "",
  outdoorTemperatureC: "",
  element: "",
};

/** 19 °C, 78 % and a window pane at 9 °C: a bedroom on a cold morning. */
export const EXAMPLE_FORM: CalculatorFormValues = {
  ...EMPTY_FORM,
  airTemperatureC: "19",
  relativeHumidityPct: "78",
  surfaceTemperatureC: "9",
};

/** The ranges of src/lib/schemas/psychrometrics.ts, for saying them (the schema checks them). */
const RANGES = {
  airTemperatureC: { min: -20, max: 50, unit: "°C" },
  relativeHumidityPct: { min: 0, max: 100, unit: "%" },
  surfaceTemperatureC: { min: -30, max: 50, unit: "°C" },
  outdoorTemperatureC: { min: -30, max: 40, unit: "°C" },
} as const;

/**
 * The schema speaks English in API field names ("relativeHumidityPct must be…"); the form says the same
 * rule in the reader's language with the field's own label ("Relative humidity must be…"), from the kind
 * of problem the schema found. `calculator:field.<name>` holds the labels.
 */
export function fieldMessage(
  t: TFunction,
  field: CalculatorField,
  error: { type?: string | number; message?: string } | undefined,
): string | undefined {
  if (!error) return undefined;
  if (field === "element") return error.message;
  const { min, max, unit } = RANGES[field];
  const values = { field: t(`calculator:field.${field}`), min, max, unit };
  if (error.type === "too_big") return t("calculator:errors.atMost", values);
  if (error.type === "too_small")
    return t(field === "relativeHumidityPct" ? "calculator:errors.moreThan" : "calculator:errors.atLeast", values);
  return t("calculator:errors.notNumber", values);
}

export const REQUIRED_FIELDS = ["airTemperatureC", "relativeHumidityPct"] as const satisfies readonly CalculatorField[];
