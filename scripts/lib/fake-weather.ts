// A local stand-in for the hosted weather forecast API, spoken to through the `openmeteo` client
// (FlatBuffers, size-prefixed WeatherApiResponse tables) or as JSON when no `format` is asked for.
// Hourly temperature_2m and relative_humidity_2m only. Every value is a pure function of (latitude,
// longitude, hour): a UK-like seasonal and daily curve plus fixed pseudo-random "weather". The wall
// clock only decides what past_days / forecast_days mean; start_date & end_date name the hours outright.
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { Builder } from "flatbuffers";

export interface FakeWeather {
  /** The forecast endpoint, e.g. http://127.0.0.1:18080/v1/forecast (WEATHER_URL). */
  url: string;
  port: number;
  /** Forecast requests answered so far (400s included), for tests that check the cache. */
  requests(): number;
  close(): Promise<void>;
}

export interface FakeWeatherOptions {
  port?: number;
  host?: string;
  /** "Today" for past_days / forecast_days (default: the wall clock). */
  now?: () => Date;
}

const HOUR_S = 3600;
const DAY_S = 86_400;
const VARIABLES = ["temperature_2m", "relative_humidity_2m"] as const;
type VariableName = (typeof VARIABLES)[number];

// @openmeteo/sdk enum values (variable.js, unit.js).
const VARIABLE_CODE: Record<VariableName, number> = { temperature_2m: 47, relative_humidity_2m: 29 };
const UNIT_CODE: Record<VariableName, number> = { temperature_2m: 1, relative_humidity_2m: 35 };
const UNIT_TEXT: Record<VariableName, string> = { temperature_2m: "°C", relative_humidity_2m: "%" };

/** A 32-bit integer hash (the "lowbias32" mixer), for fixed noise from whole numbers. */
function hash32(...parts: number[]): number {
  let h = 0x9e3779b9;
  for (const p of parts) {
    h ^= p | 0;
    h ^= h >>> 16;
    h = Math.imul(h, 0x7feb352d);
    h ^= h >>> 15;
    h = Math.imul(h, 0x846ca68b);
    h ^= h >>> 16;
  }
  return h >>> 0;
}

/** Smooth noise in −1…1 over time: random values every `stepH` hours, cosine-interpolated between. */
function smoothNoise(seed: number, cellLat: number, cellLon: number, hour: number, stepH: number): number {
  const k = Math.floor(hour / stepH);
  const f = (hour - k * stepH) / stepH;
  const a = hash32(seed, cellLat, cellLon, k) / 0xffffffff;
  const b = hash32(seed, cellLat, cellLon, k + 1) / 0xffffffff;
  const w = (1 - Math.cos(Math.PI * f)) / 2;
  return 2 * (a + (b - a) * w) - 1;
}

/**
 * The outdoor air at a place and hour (hours since 1970-01-01T00:00Z). Our own model, not a climate
 * record: a mean of about 10.5 °C at 51.5° N falling 0.6 K per degree further from the
 * equator (0.3 K per degree nearer it), ±6.5 K over the year (coldest mid-January in the north), ±3 K over the day (warmest 15:00 UTC); humidity around 82 % in winter and 72 %
 * in summer, higher at night. Weather systems (about a day long) are shared across a 0.5° cell.
 */
export function fakeOutdoorAir(
  latitude: number,
  longitude: number,
  hour: number,
): { temperatureC: number; relativeHumidityPct: number } {
  const dayOfYear = (((hour / 24) % 365.2425) + 365.2425) % 365.2425; // from 1 Jan 1970, close enough for a season
  // −1 mid-January, +1 mid-July (the other way round south of the equator).
  const season = -Math.sign(latitude || 1) * Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365.2425);
  const hourOfDay = ((hour % 24) + 24) % 24;
  const daily = Math.cos((2 * Math.PI * (hourOfDay - 15)) / 24); // +1 at 15:00, −1 at 03:00
  const cellLat = Math.round(latitude * 2);
  const cellLon = Math.round(longitude * 2);
  const spell = smoothNoise(1, cellLat, cellLon, hour, 30);
  const gust = smoothNoise(2, cellLat, cellLon, hour, 7);
  const wet = smoothNoise(3, cellLat, cellLon, hour, 20);
  const temperature =
    10.5 -
    0.6 * (Math.abs(latitude) - 51.5) * (Math.abs(latitude) > 51.5 ? 1 : 0.5) +
    6.5 * season +
    (2.5 + 1 * season) * daily +
    3 * spell +
    0.8 * gust;
  const rh = 77 - 5 * season - 9 * daily + 8 * wet - 3 * spell;
  return {
    temperatureC: Math.round(temperature * 10) / 10,
    relativeHumidityPct: Math.min(100, Math.max(30, Math.round(rh))),
  };
}

class BadRequest extends Error {}

interface Query {
  latitude: number;
  longitude: number;
  variables: VariableName[];
  startS: number;
  endS: number; // exclusive
  format: "flatbuffers" | "json";
}

const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
function parseDate(name: string, text: string): number {
  const m = DATE.exec(text);
  const ms = m ? Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) : NaN;
  if (!m || Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== text) {
    throw new BadRequest(`Invalid date format for parameter ${name}: '${text}'. Expected yyyy-mm-dd.`);
  }
  return ms / 1000;
}

function intParam(params: URLSearchParams, name: string, def: number, max: number): number {
  const text = params.get(name);
  if (text === null) return def;
  if (!/^\d+$/.test(text) || Number(text) > max)
    throw new BadRequest(`Parameter '${name}' must be a whole number from 0 to ${max}.`);
  return Number(text);
}

function coordinate(params: URLSearchParams, name: "latitude" | "longitude", limit: number): number {
  const text = params.get(name);
  if (text === null || text.trim() === "") throw new BadRequest(`Parameter '${name}' is required.`);
  const v = Number(text);
  if (!Number.isFinite(v) || Math.abs(v) > limit)
    throw new BadRequest(`Parameter '${name}' must be a number from −${limit} to ${limit}.`);
  return v;
}

function parseQuery(params: URLSearchParams, now: Date): Query {
  const latitude = coordinate(params, "latitude", 90);
  const longitude = coordinate(params, "longitude", 180);
  const hourly = (params.get("hourly") ?? "")
    .split(",")
    .map((v) => v.trim())
    .filter(Boolean);
  if (hourly.length === 0) throw new BadRequest("Parameter 'hourly' is required (temperature_2m, relative_humidity_2m).");
  const unknown = hourly.filter((v) => !(VARIABLES as readonly string[]).includes(v));
  if (unknown.length) throw new BadRequest(`Unknown hourly variable: ${unknown.join(", ")}.`);
  const timezone = params.get("timezone");
  if (timezone !== null && !["GMT", "UTC"].includes(timezone)) throw new BadRequest("This service answers in GMT only.");
  const format = params.get("format");
  if (format !== null && format !== "flatbuffers" && format !== "json") throw new BadRequest(`Unknown format '${format}'.`);

  const start = params.get("start_date");
  const end = params.get("end_date");
  let startS: number;
  let endS: number;
  if (start !== null || end !== null) {
    if (start === null || end === null) throw new BadRequest("Parameters 'start_date' and 'end_date' must be given together.");
    if (params.has("past_days") || params.has("forecast_days")) {
      throw new BadRequest("Parameters 'start_date' and 'end_date' cannot be combined with 'past_days' or 'forecast_days'.");
    }
    startS = parseDate("start_date", start);
    endS = parseDate("end_date", end) + DAY_S;
    if (endS <= startS) throw new BadRequest("Parameter 'end_date' must not be before 'start_date'.");
    if (endS - startS > 366 * DAY_S) throw new BadRequest("At most 366 days can be asked for at once.");
  } else {
    const pastDays = intParam(params, "past_days", 0, 92);
    const forecastDays = intParam(params, "forecast_days", 7, 16);
    const today = Math.floor(now.getTime() / 1000 / DAY_S) * DAY_S;
    startS = today - pastDays * DAY_S;
    endS = today + forecastDays * DAY_S;
    if (endS <= startS) throw new BadRequest("No days asked for: past_days and forecast_days are both 0.");
  }
  return {
    latitude,
    longitude,
    variables: hourly as VariableName[],
    startS,
    endS,
    format: format === "flatbuffers" ? "flatbuffers" : "json",
  };
}

function series(q: Query): Record<VariableName, number[]> {
  const out: Record<VariableName, number[]> = { temperature_2m: [], relative_humidity_2m: [] };
  for (let s = q.startS; s < q.endS; s += HOUR_S) {
    const air = fakeOutdoorAir(q.latitude, q.longitude, s / HOUR_S);
    out.temperature_2m.push(air.temperatureC);
    out.relative_humidity_2m.push(air.relativeHumidityPct);
  }
  return out;
}

/** The answer as one size-prefixed WeatherApiResponse, built by field slot (the sdk has readers only). */
function flatbuffersBody(q: Query): Uint8Array {
  const values = series(q);
  const b = new Builder(1024);
  const timezone = b.createString("GMT");
  const variableOffsets = q.variables.map((name) => {
    const data = values[name];
    b.startVector(4, data.length, 4);
    for (let i = data.length - 1; i >= 0; i--) b.addFloat32(data[i]!);
    const valuesOffset = b.endVector();
    b.startObject(6);
    b.addFieldInt8(0, VARIABLE_CODE[name], 0); // variable (u8)
    b.addFieldInt8(1, UNIT_CODE[name], 0); // unit (u8)
    b.addFieldOffset(3, valuesOffset, 0); // values: [float]
    b.addFieldInt16(5, 2, 0); // altitude: 2 m
    return b.endObject();
  });
  b.startVector(4, variableOffsets.length, 4);
  for (let i = variableOffsets.length - 1; i >= 0; i--) b.addOffset(variableOffsets[i]!);
  const variablesVector = b.endVector();
  b.startObject(4);
  b.addFieldInt64(0, BigInt(q.startS), BigInt(0)); // time
  b.addFieldInt64(1, BigInt(q.endS), BigInt(0)); // timeEnd
  b.addFieldInt32(2, HOUR_S, 0); // interval
  b.addFieldOffset(3, variablesVector, 0); // variables
  const hourly = b.endObject();
  b.startObject(12);
  b.addFieldFloat32(0, q.latitude, 0);
  b.addFieldFloat32(1, q.longitude, 0);
  b.addFieldInt32(6, 0, 0); // utcOffsetSeconds
  b.addFieldOffset(7, timezone, 0);
  b.addFieldOffset(11, hourly, 0);
  const root = b.endObject();
  b.finishSizePrefixed(root);
  return b.asUint8Array();
}

function jsonBody(q: Query): object {
  const values = series(q);
  const time: string[] = [];
  for (let s = q.startS; s < q.endS; s += HOUR_S) time.push(new Date(s * 1000).toISOString().slice(0, 16));
  const hourly: Record<string, unknown> = { time };
  const units: Record<string, string> = { time: "iso8601" };
  for (const v of q.variables) {
    hourly[v] = values[v];
    units[v] = UNIT_TEXT[v];
  }
  return {
    latitude: q.latitude,
    longitude: q.longitude,
    utc_offset_seconds: 0,
    timezone: "GMT",
    hourly_units: units,
    hourly,
  };
}

export async function startFakeWeather(options: FakeWeatherOptions = {}): Promise<FakeWeather> {
  const host = options.host ?? "127.0.0.1";
  const now = options.now ?? (() => new Date());
  let count = 0;
  const server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? "/", "http://fake");
    if (req.method !== "GET" || url.pathname !== "/v1/forecast") {
      res.writeHead(404, { "content-type": "application/json" }).end(JSON.stringify({ error: true, reason: "Not found" }));
      return;
    }
    count += 1;
    try {
      const q = parseQuery(url.searchParams, now());
      if (q.format === "flatbuffers") {
        const body = flatbuffersBody(q);
        res.writeHead(200, { "content-type": "application/octet-stream", "content-length": body.byteLength }).end(body);
      } else {
        res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(jsonBody(q)));
      }
    } catch (e) {
      const reason = e instanceof BadRequest ? e.message : "Internal error";
      res
        .writeHead(e instanceof BadRequest ? 400 : 500, { "content-type": "application/json" })
        .end(JSON.stringify({ error: true, reason }));
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://${host}:${port}/v1/forecast`,
    port,
    requests: () => count,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/**
 * For npm start and npm run dev: runs the fake where WEATHER_URL points, when that is this machine's
 * loopback; null (and the app uses WEATHER_URL as it is) for any other address, or when the port is
 * taken (then whatever answers there serves the weather).
 */
export async function startFakeWeatherAt(
  weatherUrl: string,
  warn: (line: string) => void = console.warn,
): Promise<FakeWeather | null> {
  const url = new URL(weatherUrl);
  if (!["127.0.0.1", "localhost", "[::1]"].includes(url.hostname) || url.pathname !== "/v1/forecast") return null;
  const port = Number(url.port || 80);
  try {
    return await startFakeWeather({ port, host: url.hostname === "[::1]" ? "::1" : "127.0.0.1" });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== "EADDRINUSE") throw error;
    warn(`Port ${port} is taken, so the local weather service was not started; the app asks whatever answers at ${weatherUrl}.`);
    return null;
  }
}
