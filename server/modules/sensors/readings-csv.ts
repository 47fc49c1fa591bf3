// A sensor's readings as CSV (`Content-Type: text/csv`), the form for a gateway or logger sending a
// backlog: a header line naming the columns, then one reading a line. Read byte by byte from the body's
// Buffer: an accepted value is copied into its LOAD DATA row as it was sent, so a batch of thousands of
// readings makes no object or string per reading (the JSON body's parse and garbage were most of the
// ingest's time in the backfill benchmark).
//
//   takenAt,airTemperatureC,relativeHumidityPct,surfaceTemperatureC,batteryPct
//   2026-12-05T06:45:00Z,19.5,71.25,12.4,88
//
// Times as in JSON (ISO 8601 with a zone); numbers plain decimals (`-3.25`, no exponent); an empty
// surface or battery field is "not measured". Columns in any order; surface and battery may be left out.
import { SENSOR_CSV_BATCH_MAX, SENSOR_CSV_COLUMNS, SENSOR_CSV_REQUIRED } from "../../../src/lib/schemas/sensor-readings.js";
import { ValidationError } from "../../lib/errors.js";
import {
  MISSING,
  dec2,
  parseTakenAt,
  sqlDateTime,
  timeRefusal,
  utcMs,
  valueRefusal,
  type CheckedBatch,
  type ReadingLimits,
} from "./reading-checks.js";

const NL = 10;
const CR = 13;
const COMMA = 44;
const TAB = 9;
const SPACE = 32;
const MINUS = 45;
const DOT = 46;
const ZERO = 48;
const NONE = Buffer.from("\\N");
export const EMPTY = "The CSV is empty: send a header line, then a reading a line.";
/** Lines checked between pauses (about half a millisecond's work on a 2-core machine). */
const YIELD_EVERY = 1000;

type Column = (typeof SENSOR_CSV_COLUMNS)[number];

/** The header's columns in the order sent; a 400 naming the problem when it is not one we read. */
function readHeader(text: string): Column[] {
  const names = text.split(",").map((n) => n.trim());
  const known = new Set<string>(SENSOR_CSV_COLUMNS);
  const unknown = names.filter((n) => !known.has(n));
  if (unknown.length > 0) {
    throw new ValidationError(
      `The CSV header must name the columns: ${SENSOR_CSV_COLUMNS.join(",")} (surface and battery may be left out). ` +
        `Not known: ${unknown.map((n) => `"${n.slice(0, 40)}"`).join(", ")}.`,
    );
  }
  const twice = names.find((n, i) => names.indexOf(n) !== i);
  if (twice) throw new ValidationError(`The CSV header names ${twice} twice.`);
  const missing = SENSOR_CSV_REQUIRED.filter((n) => !names.includes(n));
  if (missing.length > 0) throw new ValidationError(`The CSV header lacks ${missing.join(", ")}.`);
  return names as Column[];
}

/** Fraction digits of the last number read by `decimal` (a module variable: no object per value). */
let fractionDigits = 0;

/** A plain decimal (`-12.25`) between start and end, or NaN. Sets `fractionDigits`. */
function decimal(b: Buffer, start: number, end: number): number {
  let i = start;
  let negative = false;
  if (i < end && b[i] === MINUS) {
    negative = true;
    i++;
  }
  let whole = 0;
  let digits = 0;
  for (; i < end; i++) {
    const d = b[i]! - ZERO;
    if (d < 0 || d > 9) break;
    whole = whole * 10 + d;
    digits++;
  }
  let fraction = 0;
  let scale = 1;
  fractionDigits = 0;
  if (i < end && b[i] === DOT) {
    for (i++; i < end; i++) {
      const d = b[i]! - ZERO;
      if (d < 0 || d > 9) return Number.NaN;
      fraction = fraction * 10 + d;
      scale *= 10;
      fractionDigits++;
    }
    if (fractionDigits === 0) return Number.NaN;
  }
  if (i !== end || digits === 0 || digits > 6 || fractionDigits > 9) return Number.NaN;
  const value = whole + fraction / scale;
  return negative ? -value : value;
}

/** Copies b[start, end) to out at o (a loop: Buffer#copy costs more than a few bytes' worth); the bytes copied. */
function put(b: Buffer, start: number, end: number, out: Buffer, o: number): number {
  for (let i = start; i < end; i++) out[o++] = b[i]!;
  return end - start;
}

/** Two digits at i as a number (NaN unless both are digits). */
function two(b: Buffer, i: number): number {
  const hi = b[i]! - ZERO;
  const lo = b[i + 1]! - ZERO;
  return hi >= 0 && hi <= 9 && lo >= 0 && lo <= 9 ? hi * 10 + lo : Number.NaN;
}

/** `YYYY-MM-DDTHH:MM:SSZ` read straight from the bytes (ms), or NaN for any other form (read as text then). */
function plainUtc(b: Buffer, s: number, e: number): number {
  if (e - s !== 20 || b[s + 4] !== MINUS || b[s + 7] !== MINUS || b[s + 10] !== 84 /* T */ || b[s + 19] !== 90 /* Z */) {
    return Number.NaN;
  }
  if (b[s + 13] !== 58 || b[s + 16] !== 58 /* : */) return Number.NaN;
  const year = two(b, s) * 100 + two(b, s + 2);
  const ms = utcMs(year, two(b, s + 5), two(b, s + 8), two(b, s + 11), two(b, s + 14), two(b, s + 17));
  return ms === null || Number.isNaN(year) ? Number.NaN : ms;
}

/**
 * Checks a CSV body's readings one by one (a refusal names the reading by its index among the data
 * lines, from 0, as the JSON body's do); the accepted ones become LOAD DATA rows. A header we cannot
 * read, no readings or more than SENSOR_CSV_BATCH_MAX are a 400 for the whole body.
 */
export async function checkCsvReadings(body: Buffer, limits: ReadingLimits): Promise<CheckedBatch> {
  let pos = body.length >= 3 && body[0] === 0xef && body[1] === 0xbb && body[2] === 0xbf ? 3 : 0;
  let first = pos;
  while (first < body.length && (body[first] === NL || body[first] === CR || body[first] === SPACE || body[first] === TAB))
    first++;
  if (first === body.length) throw new ValidationError(EMPTY);
  let headerEnd = body.indexOf(NL, pos);
  if (headerEnd < 0) headerEnd = body.length;
  const columns = readHeader(body.toString("utf8", pos, headerEnd).replace(/\r$/, ""));
  pos = headerEnd + 1;

  let lines = 1;
  for (let i = body.indexOf(NL, pos); i >= 0; i = body.indexOf(NL, i + 1)) lines++;

  const at = {
    takenAt: columns.indexOf("takenAt"),
    air: columns.indexOf("airTemperatureC"),
    rh: columns.indexOf("relativeHumidityPct"),
    surface: columns.indexOf("surfaceTemperatureC"),
    battery: columns.indexOf("batteryPct"),
  };
  const fieldStart = new Int32Array(columns.length);
  const fieldEnd = new Int32Array(columns.length);
  // A row is never longer than its line plus "\N" for two absent values and the date's rewrite.
  const out = Buffer.allocUnsafe(body.length - pos + lines * 8 + 64);
  let o = 0;
  const refused: CheckedBatch["refused"] = [];
  let count = 0;
  let index = 0;
  let newestMs = Number.NEGATIVE_INFINITY;
  /** Refuses a reading, quoting its time as sent (the fields' bounds are the current line's). */
  const refuse = (reading: number, reason: string, withTime = true) => {
    const ts = fieldStart[at.takenAt]!;
    refused.push({
      index: reading,
      takenAt: withTime ? body.toString("utf8", ts, Math.min(fieldEnd[at.takenAt]!, ts + 40)) : null,
      reason,
    });
  };

  while (pos < body.length) {
    let end = body.indexOf(NL, pos);
    if (end < 0) end = body.length;
    const next = end + 1;
    if (end > pos && body[end - 1] === CR) end--;
    if (end === pos) {
      pos = next; // a blank line (the last newline, say) is not a reading
      continue;
    }
    const reading = index++;
    // A pause every so many lines lets the event loop answer MariaDB meanwhile (another request's bulk
    // load waits on this process for each of its steps; see BULK_ROWS in sensor-ingest.service.ts).
    if (reading % YIELD_EVERY === YIELD_EVERY - 1) await new Promise<void>((resolve) => setImmediate(resolve));
    // The fields' bounds; more or fewer fields than the header is a refusal.
    let fields = 0;
    let s = pos;
    for (let i = pos; i <= end; i++) {
      if (i === end || body[i] === COMMA) {
        if (fields < columns.length) {
          fieldStart[fields] = s;
          fieldEnd[fields] = i;
        }
        fields++;
        s = i + 1;
      }
    }
    pos = next;
    if (fields !== columns.length) {
      refuse(reading, `This line has ${fields} fields; the header names ${columns.length}.`, false);
      continue;
    }

    const ts = fieldStart[at.takenAt]!;
    const te = fieldEnd[at.takenAt]!;
    let ms = plainUtc(body, ts, te);
    let timeText: string | null = null;
    if (Number.isNaN(ms)) {
      if (te === ts) {
        refuse(reading, "takenAt is missing or not text.", false);
        continue;
      }
      timeText = body.toString("utf8", ts, te);
      const parsed = parseTakenAt(timeText);
      if (typeof parsed === "string") {
        refuse(reading, parsed);
        continue;
      }
      ms = parsed;
    }
    const late = timeRefusal(ms, limits);
    if (late) {
      refuse(reading, late);
      continue;
    }

    const air = decimal(body, fieldStart[at.air]!, fieldEnd[at.air]!);
    const airCopy = fractionDigits <= 2;
    const rh = decimal(body, fieldStart[at.rh]!, fieldEnd[at.rh]!);
    const rhCopy = fractionDigits <= 2;
    if (Number.isNaN(air)) {
      refuse(reading, MISSING.air);
      continue;
    }
    if (Number.isNaN(rh)) {
      refuse(reading, MISSING.rh);
      continue;
    }
    let surface: number | null = null;
    let surfaceCopy = true;
    if (at.surface >= 0 && fieldEnd[at.surface]! > fieldStart[at.surface]!) {
      surface = decimal(body, fieldStart[at.surface]!, fieldEnd[at.surface]!);
      surfaceCopy = fractionDigits <= 2;
      if (Number.isNaN(surface)) {
        refuse(reading, MISSING.surface);
        continue;
      }
    }
    let battery: number | null = null;
    let batteryCopy = true;
    if (at.battery >= 0 && fieldEnd[at.battery]! > fieldStart[at.battery]!) {
      battery = decimal(body, fieldStart[at.battery]!, fieldEnd[at.battery]!);
      batteryCopy = fractionDigits === 0;
      if (Number.isNaN(battery)) {
        refuse(reading, MISSING.battery);
        continue;
      }
    }
    const wrong = valueRefusal(air, rh, surface, battery);
    if (wrong) {
      refuse(reading, wrong);
      continue;
    }

    if (ms > newestMs) newestMs = ms;
    count++;
    if (timeText === null) {
      o += put(body, ts, ts + 10, out, o);
      out[o++] = SPACE;
      o += put(body, ts + 11, ts + 19, out, o);
    } else {
      o += out.write(sqlDateTime(ms, timeText), o, "latin1");
    }
    out[o++] = TAB;
    o += airCopy ? put(body, fieldStart[at.air]!, fieldEnd[at.air]!, out, o) : out.write(dec2(air), o, "latin1");
    out[o++] = TAB;
    o += rhCopy ? put(body, fieldStart[at.rh]!, fieldEnd[at.rh]!, out, o) : out.write(dec2(rh), o, "latin1");
    out[o++] = TAB;
    if (surface === null) o += put(NONE, 0, 2, out, o);
    else
      o += surfaceCopy
        ? put(body, fieldStart[at.surface]!, fieldEnd[at.surface]!, out, o)
        : out.write(dec2(surface), o, "latin1");
    out[o++] = TAB;
    if (battery === null) o += put(NONE, 0, 2, out, o);
    else
      o += batteryCopy
        ? put(body, fieldStart[at.battery]!, fieldEnd[at.battery]!, out, o)
        : out.write(String(Math.round(battery)), o, "latin1");
    out[o++] = NL;
  }
  if (index === 0) throw new ValidationError("The CSV has a header but no readings.");
  if (index > SENSOR_CSV_BATCH_MAX) {
    throw new ValidationError(
      `At most ${SENSOR_CSV_BATCH_MAX.toLocaleString("en-GB")} readings in one request; this CSV has ${index.toLocaleString("en-GB")}.`,
    );
  }
  return { rows: out.subarray(0, o), count, newestMs, refused };
}
