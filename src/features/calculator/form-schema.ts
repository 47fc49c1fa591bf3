// The calculator form over the API's own schema: the fields arrive as text, so this layer only
// turns text into numbers (or "not given") and the API schema keeps the ranges and messages.
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

export const FIELD_LABELS: Record<CalculatorField, string> = {
  airTemperatureC: "Room temperature",
  relativeHumidityPct: "Relative humidity",
  surfaceTemperatureC: "Surface temperature",
  outdoorTemperatureC: "Outdoor temperature",
  element: "Building element",
};

/** The schema speaks in API field names ("relativeHumidityPct must be…"); the form says "Relative humidity must be…". */
export function fieldMessage(field: CalculatorField, message: string | undefined): string | undefined {
  if (!message) return undefined;
  return message.startsWith(field) ? FIELD_LABELS[field] + message.slice(field.length) : message;
}

export const REQUIRED_FIELDS = ["airTemperatureC", "relativeHumidityPct"] as const satisfies readonly CalculatorField[];
