// The public series calculator's work, run on a worker thread: read the request's JSON, count its
// readings against the caller's limits, check it with the same schema as ever, and evaluate it with
// the engine. The request thread never parses the body: a 10 MB series costs it nothing but the bytes.
import { evaluateSeries, type MaterialSensitivity, type SeriesResult } from "../../../src/lib/domain/index.js";
import { evaluateSeriesSchema } from "../../../src/lib/schemas/psychrometrics.js";
import { ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";

export type SeriesTaskOutput =
  | { ok: true; result: SeriesResult; count: number }
  /** Not JSON (400 invalid_json), or not a valid series (400 with the fields). */
  | { ok: false; refused: "invalid-json" }
  | { ok: false; refused: "invalid"; message: string; details: unknown }
  /** More readings than the caller may send in one request (413), or than the address has left (429). */
  | { ok: false; refused: "too-many" | "over-budget"; count: number };

export interface SeriesTaskInput {
  json: Uint8Array;
  /** The most readings this caller may send in one request. */
  maxReadings: number;
  /** The most readings the address may have evaluated now. */
  allowance: number;
}

export function evaluateSeriesRequest(input: SeriesTaskInput): SeriesTaskOutput {
  let body: unknown;
  try {
    body = JSON.parse(new TextDecoder().decode(input.json));
  } catch {
    return { ok: false, refused: "invalid-json" };
  }
  const readings = (body as { readings?: unknown } | null)?.readings;
  const count = Array.isArray(readings) ? readings.length : 1;
  if (count > input.maxReadings) return { ok: false, refused: "too-many", count };
  if (count > input.allowance) return { ok: false, refused: "over-budget", count };
  try {
    const parsed = parse(evaluateSeriesSchema, body);
    return {
      ok: true,
      count,
      result: evaluateSeries({ ...parsed, material: parsed.material as MaterialSensitivity | undefined }),
    };
  } catch (e) {
    // Errors lose their class crossing threads: hand the 400 back as data.
    if (e instanceof ValidationError) return { ok: false, refused: "invalid", message: e.message, details: e.details };
    throw e;
  }
}
