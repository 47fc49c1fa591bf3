// The public series calculator's work, run on a worker thread: read the request's JSON, check it
// with the same schema as ever, and evaluate it with the engine. Nothing here touches the request thread.
import { evaluateSeries, type MaterialSensitivity, type SeriesResult } from "../../../src/lib/domain/index.js";
import { evaluateSeriesSchema } from "../../../src/lib/schemas/psychrometrics.js";
import { ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";

export type SeriesTaskOutput = { ok: true; result: SeriesResult } | { ok: false; message: string; details: unknown };

export function evaluateSeriesRequest(input: { json: Uint8Array }): SeriesTaskOutput {
  const body: unknown = JSON.parse(new TextDecoder().decode(input.json));
  try {
    const parsed = parse(evaluateSeriesSchema, body);
    return { ok: true, result: evaluateSeries({ ...parsed, material: parsed.material as MaterialSensitivity | undefined }) };
  } catch (e) {
    // Errors lose their class crossing threads: hand the 400 back as data.
    if (e instanceof ValidationError) return { ok: false, message: e.message, details: e.details };
    throw e;
  }
}
