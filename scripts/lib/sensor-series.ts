// Simulated sensor readings: a pure function of (seed, sensor, time), so the simulator, the demo and
// the bench can each ask for any reading of any sensor at any moment, in any order, and get the same
// answer every time (no state carried from one reading to the next). Randomness comes from hashing
// (seed, name, channel, slot), never from a generator advanced in sequence.
//
// The model is rough and our own (common practice, no source, unless a line says otherwise): outdoor
// air with a season, a day and passing weather; each home heated on a daily schedule with the room
// warming and cooling exponentially; indoor vapour pressure = outdoor vapour pressure + a moisture
// excess from the people in the home (ISO 13788 treats the excess the same way), raised by showers,
// cooking and drying washing; a surface probe at the temperature the wall's factor gives
// (ISO 13788: θsi = θe + fRsi·(θi − θe)); sensor noise; a battery that runs down.
//
// Scripted sensors, each from `script.fromMs`:
// - developing-condensation: over `script.days` the home's moisture excess rises by 420 Pa (as if an
//   extract fan had failed) and the room stops reaching its heating set point by 2 K (a cold spell);
//   the probe sits on a cold wall (give it a low temperature factor), so its surface humidity creeps
//   up day by day to condensing at night;
// - leak: the probe sits on a wet patch: evaporation holds it near the air's wet-bulb temperature,
//   several kelvin below where the wall's factor would put it, while the room's air stays dry;
// - dead: the battery sinks over the last 3 days, then no reading at all from `fromMs`;
// - drifting: the humidity sensor reads high by `pctPerDay` more each day (capped at 100 %);
// - flat-lined: from `fromMs` every reading repeats the reading taken at `fromMs`, exactly.

export type SeriesRoomKind = "living" | "kitchen" | "bathroom" | "bedroom" | "other";

export type SeriesScript =
  | { kind: "normal" }
  | { kind: "developing-condensation"; fromMs: number; days: number }
  | { kind: "leak"; fromMs: number }
  | { kind: "dead"; fromMs: number }
  | { kind: "drifting"; fromMs: number; pctPerDay: number }
  | { kind: "flat-lined"; fromMs: number };

export interface SeriesSensor {
  /** The device's serial: names its own random draws (noise, reporting phase). */
  serial: string;
  /** The home it is in: the household's routine (showers, cooking, heating times) is the home's. */
  home: string;
  room: SeriesRoomKind;
  /** Temperature factor fRsi where the surface probe sits (ISO 13788; 0.75 is the usual minimum for a sound wall). */
  temperatureFactor: number;
  measuresSurface: boolean;
  intervalS: number;
  /** When it was fitted (its battery was full then). */
  installedAtMs: number;
  script: SeriesScript;
}

export interface SimulatedReading {
  takenAt: string;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC?: number;
  batteryPct: number;
}

export interface OutdoorConditions {
  temperatureC: number;
  relativeHumidityPct: number;
}

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** "15m", "7d", "90s", "2h" or a number of seconds → ms. */
export function parseDuration(text: string): number {
  const match = /^(\d+(?:\.\d+)?)\s*(s|m|h|d)?$/.exec(text.trim());
  if (!match) throw new Error(`"${text}" is not a duration (e.g. 90s, 15m, 6h, 7d)`);
  const unit = { s: 1000, m: 60_000, h: HOUR, d: DAY }[match[2] ?? "s"]!;
  return Number(match[1]) * unit;
}

// ---------------------------------------------------------------- hashing
/** FNV-1a of a string, 32 bits. */
function hashString(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** Mixes integers into one 32-bit hash (murmur3's finaliser after each step). */
function mix(...parts: number[]): number {
  let h = 0x9e3779b9;
  for (const p of parts) {
    h ^= (p | 0) + 0x7f4a7c15 + (h << 6) + (h >>> 2);
    h ^= h >>> 16;
    h = Math.imul(h, 0x85ebca6b);
    h ^= h >>> 13;
    h = Math.imul(h, 0xc2b2ae35);
    h ^= h >>> 16;
  }
  return h >>> 0;
}

/** A uniform draw in [0, 1) named by its parts. */
const uniform = (...parts: number[]) => mix(...parts) / 4294967296;

/** A smooth random wave in [−1, 1]: random values at knots `periodMs` apart, eased in between. */
function wave(seed: number, name: number, channel: number, atMs: number, periodMs: number): number {
  const x = atMs / periodMs;
  const k = Math.floor(x);
  const f = x - k;
  const a = uniform(seed, name, channel, k) * 2 - 1;
  const b = uniform(seed, name, channel, k + 1) * 2 - 1;
  const ease = (1 - Math.cos(Math.PI * f)) / 2;
  return a + (b - a) * ease;
}

/** About normal, mean 0 and standard deviation 1 (sum of four uniforms, scaled). */
function gaussian(seed: number, name: number, channel: number, slot: number): number {
  let sum = 0;
  for (let i = 0; i < 4; i++) sum += uniform(seed, name, channel, slot, i);
  return (sum - 2) * Math.sqrt(3);
}

// ---------------------------------------------------------------- physics
/**
 * Saturation vapour pressure over water, Pa: Magnus form with Alduchov and Eskridge's (1996)
 * constants 610.94 Pa, 17.625, 243.04 °C (from memory). Good to 0.4 % from −40 to 50 °C; the
 * tests check the series with the domain's psychrolib, independently of this.
 */
export function magnusSaturationPa(temperatureC: number): number {
  return 610.94 * Math.exp((17.625 * temperatureC) / (temperatureC + 243.04));
}

/** The inverse of magnusSaturationPa: the dew point, °C, of a vapour pressure. */
function magnusDewPointC(vapourPressurePa: number): number {
  const g = Math.log(vapourPressurePa / 610.94);
  return (243.04 * g) / (17.625 - g);
}

const round = (value: number, places: number) => {
  const f = 10 ** places;
  return Math.round(value * f) / f;
};

// ---------------------------------------------------------------- outdoors
const OUTDOOR = hashString("outdoor");

/**
 * Outdoor air at a moment: a temperate maritime climate of our own making (coldest late January
 * around 4 °C, warmest late July around 17 °C, 5 K between night and afternoon, weather fronts a
 * day or two long), and humid (about 87 % in winter, 75 % in summer, lower in the afternoon).
 */
export function outdoorAt(seed: number, atMs: number): OutdoorConditions {
  const yearAngle = (2 * Math.PI * (atMs / DAY - 20)) / 365.25; // 0 around 20 January
  const hour = (atMs % DAY) / HOUR;
  const dayAngle = (2 * Math.PI * (hour - 15)) / 24; // 0 at 3 pm
  const temperatureC =
    10.5 -
    6.5 * Math.cos(yearAngle) +
    2.5 * Math.cos(dayAngle) +
    3 * wave(seed, OUTDOOR, 1, atMs, 36 * HOUR) +
    wave(seed, OUTDOOR, 2, atMs, 6 * HOUR);
  const rh = 81 + 6 * Math.cos(yearAngle) - 7 * Math.cos(dayAngle) + 6 * wave(seed, OUTDOOR, 3, atMs, 30 * HOUR);
  return { temperatureC, relativeHumidityPct: Math.min(100, Math.max(40, rh)) };
}

/** The day's mean outdoor temperature around a moment (what a heated home's free-running temperature follows). */
function outdoorDailyMeanC(seed: number, atMs: number): number {
  const yearAngle = (2 * Math.PI * (atMs / DAY - 20)) / 365.25;
  return 10.5 - 6.5 * Math.cos(yearAngle) + 3 * wave(seed, OUTDOOR, 1, atMs, 36 * HOUR);
}

// ---------------------------------------------------------------- the home
const SET_POINT_C: Record<SeriesRoomKind, number> = { living: 20.5, kitchen: 19.5, bathroom: 20.5, bedroom: 18.5, other: 18 };
/** Moisture excess of each room with nothing going on, Pa (an ordinary home: ISO 13788's classes 2–3 in winter). */
const BASE_EXCESS_PA: Record<SeriesRoomKind, number> = { living: 260, kitchen: 320, bathroom: 330, bedroom: 240, other: 200 };
const HEAT_UP_TAU_H = 0.8;
const COOL_DOWN_TAU_H = 4;

/** The heating's on and off hours (UTC) for a home: mornings and evenings, each home a little different. */
function heatingPeriods(seed: number, home: number): [number, number][] {
  const shift = (uniform(seed, home, 10) - 0.5) * 1.5;
  const longer = uniform(seed, home, 11) * 1.5;
  return [
    [6.25 + shift, 8.5 + shift],
    [16.25 + shift - longer, 22.5 + shift],
  ];
}

/**
 * Room air temperature: heated towards the set point in the heating periods, falling exponentially
 * towards the free-running temperature (outdoors plus the home's gains) outside them. Worked out from
 * the previous evening's switch-off, so it needs no earlier state.
 */
function indoorTemperatureC(seed: number, sensor: SeriesSensor, home: number, atMs: number, setPointDropK: number): number {
  const dayStart = Math.floor(atMs / DAY) * DAY;
  const gains = 7 + 3 * uniform(seed, home, 12);
  const free = (ms: number) => outdoorDailyMeanC(seed, ms) + gains;
  const set = SET_POINT_C[sensor.room] + (uniform(seed, home, 13) - 0.5) - setPointDropK;
  const periods = heatingPeriods(seed, home);
  const [, lastOff] = periods[periods.length - 1]!;
  // From yesterday's last switch-off (taken as at the set point, or free-running if warmer).
  let t = dayStart + (lastOff - 24) * HOUR;
  let temperature = Math.max(set, free(t));
  const events: [number, boolean][] = [];
  for (const [on, off] of periods) events.push([dayStart + on * HOUR, true], [dayStart + off * HOUR, false]);
  let heating = false;
  for (const [eventMs, turnsOn] of [...events, [Number.POSITIVE_INFINITY, false] as [number, boolean]]) {
    const until = Math.min(eventMs, atMs);
    if (until > t) {
      const hours = (until - t) / HOUR;
      const target = heating ? Math.max(set, free(until)) : free(until);
      const tau = heating ? HEAT_UP_TAU_H : COOL_DOWN_TAU_H;
      temperature = target + (temperature - target) * Math.exp(-hours / tau);
      t = until;
    }
    if (eventMs >= atMs) break;
    heating = turnsOn;
  }
  // Outdoors' own day-night swing reaches inside a little.
  const dayAngle = (2 * Math.PI * ((atMs % DAY) / HOUR - 15)) / 24;
  return temperature + 0.4 * Math.cos(dayAngle);
}

/** A pulse of moisture: rising while the activity lasts, then decaying (its value at `sinceStartH`). */
function pulse(sinceStartH: number, durationH: number, decayH: number): number {
  if (sinceStartH < 0) return 0;
  if (sinceStartH < durationH) return 1 - Math.exp(-sinceStartH / (durationH / 2));
  const peak = 1 - Math.exp(-2);
  return peak * Math.exp(-(sinceStartH - durationH) / decayH);
}

/** The moisture the household adds to a room at a moment, Pa above outdoors. */
function moistureExcessPa(seed: number, sensor: SeriesSensor, home: number, atMs: number): number {
  const room = sensor.room;
  const household = 0.75 + 0.5 * uniform(seed, home, 20);
  let excess = BASE_EXCESS_PA[room] * household;
  const hourOfDay = (atMs % DAY) / HOUR;
  // People asleep in bedrooms from 11 pm to 7 am.
  if (room === "bedroom" && (hourOfDay >= 23 || hourOfDay < 7)) excess += 180 * household;
  const today = Math.floor(atMs / DAY);
  for (const day of [today - 1, today]) {
    const sinceMidnightH = (atMs - day * DAY) / HOUR;
    // Morning shower (and an evening one on some days).
    const shower = 6.5 + 1.5 * uniform(seed, home, 30, day);
    const showerPa = room === "bathroom" ? 1500 : 70;
    excess += showerPa * pulse(sinceMidnightH - shower, 0.25, 0.6);
    if (uniform(seed, home, 31, day) < 0.4) excess += showerPa * pulse(sinceMidnightH - 20.5, 0.25, 0.6);
    // Cooking: breakfast and the evening meal.
    const kitchenPa = room === "kitchen" ? 1 : room === "living" ? 0.15 : 0.05;
    excess += 350 * kitchenPa * pulse(sinceMidnightH - 7.5, 0.3, 0.7);
    const dinner = 17.5 + 1.5 * uniform(seed, home, 32, day);
    excess += 900 * kitchenPa * pulse(sinceMidnightH - dinner, 0.75, 0.8);
    // Washing dried indoors on about one day in three (where else, in winter, without a dryer).
    if (uniform(seed, home, 33, day) < 0.35) {
      const dryingPa = room === "living" || room === "bedroom" ? 300 : 80;
      excess += dryingPa * pulse(sinceMidnightH - 10, 9, 3);
    }
  }
  return excess;
}

// ---------------------------------------------------------------- the sensor
/** The sensor's battery, %: a little each month, and the last few percent quickly before a dead sensor stops. */
function batteryPct(sensor: SeriesSensor, atMs: number): number {
  const months = Math.max(0, atMs - sensor.installedAtMs) / (30 * DAY);
  let pct = 100 - 1.5 * months;
  if (sensor.script.kind === "dead") {
    const untilDeadH = (sensor.script.fromMs - atMs) / HOUR;
    if (untilDeadH < 72) pct = Math.min(pct, 2 + (12 * untilDeadH) / 72);
  }
  return Math.max(1, Math.round(pct));
}

/** Where the reading schedule of a sensor falls: its first reading's offset from the epoch, in ms. */
export function readingPhaseMs(sensor: SeriesSensor): number {
  return (hashString(`phase:${sensor.serial}`) % sensor.intervalS) * 1000;
}

/** The times (ms) a sensor reports at in [fromMs, toMs): every interval, from its own phase. */
export function readingTimes(sensor: SeriesSensor, fromMs: number, toMs: number): number[] {
  const step = sensor.intervalS * 1000;
  const phase = readingPhaseMs(sensor);
  const first = Math.ceil((fromMs - phase) / step) * step + phase;
  const times: number[] = [];
  for (let t = first; t < toMs; t += step) times.push(t);
  return times;
}

/**
 * The reading a sensor sends at `atMs` (whole seconds), or null when it sends none (dead, or not
 * yet fitted). The same arguments always give the same reading.
 */
export function simulatedReading(seed: number, sensor: SeriesSensor, atMs: number): SimulatedReading | null {
  const takenMs = Math.floor(atMs / 1000) * 1000;
  if (takenMs < sensor.installedAtMs) return null;
  const script = sensor.script;
  if (script.kind === "dead" && takenMs >= script.fromMs) return null;
  if (script.kind === "flat-lined" && takenMs > script.fromMs) {
    const stuck = simulatedReading(seed, { ...sensor, script: { kind: "normal" } }, script.fromMs);
    if (stuck) return { ...stuck, takenAt: new Date(takenMs).toISOString(), batteryPct: batteryPct(sensor, takenMs) };
  }
  const home = hashString(`home:${sensor.home}`);
  const name = hashString(`sensor:${sensor.serial}`);
  const slot = Math.floor(takenMs / 1000);

  const ramp =
    script.kind === "developing-condensation" ? Math.min(1, Math.max(0, (takenMs - script.fromMs) / (script.days * DAY))) : 0;
  const outdoor = outdoorAt(seed, takenMs);
  const air = indoorTemperatureC(seed, sensor, home, takenMs, 2 * ramp);
  const outdoorVapourPa = (outdoor.relativeHumidityPct / 100) * magnusSaturationPa(outdoor.temperatureC);
  const vapourPa = outdoorVapourPa + moistureExcessPa(seed, sensor, home, takenMs) + 420 * ramp;
  let rh = (100 * vapourPa) / magnusSaturationPa(air);
  if (script.kind === "leak") rh = Math.min(rh, 42 + 3 * wave(seed, name, 5, takenMs, 8 * HOUR));
  if (script.kind === "drifting" && takenMs > script.fromMs) rh += (script.pctPerDay * (takenMs - script.fromMs)) / DAY;

  const reading: SimulatedReading = {
    takenAt: new Date(takenMs).toISOString(),
    airTemperatureC: round(air + 0.08 * gaussian(seed, name, 1, slot), 2),
    relativeHumidityPct: round(Math.min(100, Math.max(1, rh + 0.6 * gaussian(seed, name, 2, slot))), 1),
    batteryPct: batteryPct(sensor, takenMs),
  };
  if (sensor.measuresSurface) {
    let surface = outdoor.temperatureC + sensor.temperatureFactor * (air - outdoor.temperatureC);
    if (script.kind === "leak" && takenMs >= script.fromMs) {
      // A wet surface sits near the wet-bulb temperature: about a third of the way from dew point to air.
      const airVapourPa = (reading.relativeHumidityPct / 100) * magnusSaturationPa(air);
      const dewPoint = magnusDewPointC(airVapourPa);
      surface = Math.min(surface, dewPoint + (air - dewPoint) / 3);
    }
    reading.surfaceTemperatureC = round(surface + 0.08 * gaussian(seed, name, 3, slot), 2);
  }
  return reading;
}

/** Every reading a sensor sends in [fromMs, toMs), in time order. */
export function simulatedReadings(seed: number, sensor: SeriesSensor, fromMs: number, toMs: number): SimulatedReading[] {
  const readings: SimulatedReading[] = [];
  for (const t of readingTimes(sensor, fromMs, toMs)) {
    const r = simulatedReading(seed, sensor, t);
    if (r) readings.push(r);
  }
  return readings;
}

// ---------------------------------------------------------------- homes to simulate
export interface PlannedSensor {
  room: SeriesRoomKind;
  model: string;
  placement: string;
  measuresSurface: boolean;
  temperatureFactor: number;
  script: SeriesScript;
}

/** What the first five simulated homes show, in order; every later home is ordinary. */
export const SCRIPTED_HOMES = ["developing-condensation", "leak", "dead", "drifting", "flat-lined"] as const;

/**
 * The sensors of the `index`-th simulated home, with the scripts of the first five dated from
 * `startMs` (the start of the simulated period, e.g. the first backfilled day): condensation
 * developing over days 1–6, a wet patch throughout, a sensor dying on day 5, one drifting from day 2
 * and one stuck from day 4. Each home has a living-room sensor (air only) and a bedroom one with a
 * probe on the external wall; the scripted sensor takes the room its story needs.
 */
export function plannedSensors(index: number, startMs: number): PlannedSensor[] {
  const living: PlannedSensor = {
    room: "living",
    model: "Dewline Sim TH-1",
    placement: "Internal wall, 1.5 m above floor",
    measuresSurface: false,
    temperatureFactor: 0.75,
    script: { kind: "normal" },
  };
  const bedroom: PlannedSensor = {
    room: "bedroom",
    model: "Dewline Sim TH-2S",
    placement: "External wall corner, 0.3 m above floor, probe on the wall",
    measuresSurface: true,
    temperatureFactor: 0.7 + 0.01 * (index % 8),
    script: { kind: "normal" },
  };
  const day = 24 * HOUR;
  switch (SCRIPTED_HOMES[index]) {
    case "developing-condensation":
      return [
        living,
        { ...bedroom, temperatureFactor: 0.55, script: { kind: "developing-condensation", fromMs: startMs + day, days: 5 } },
      ];
    case "leak":
      return [
        {
          ...living,
          model: "Dewline Sim TH-2S",
          placement: "External wall below the window, probe on the wall",
          measuresSurface: true,
          script: { kind: "leak", fromMs: startMs },
        },
        bedroom,
      ];
    case "dead":
      return [
        living,
        bedroom,
        { ...living, room: "kitchen", placement: "Above the door", script: { kind: "dead", fromMs: startMs + 5 * day } },
      ];
    case "drifting":
      return [
        living,
        bedroom,
        {
          ...living,
          room: "bathroom",
          placement: "Beside the mirror",
          script: { kind: "drifting", fromMs: startMs + 2 * day, pctPerDay: 3 },
        },
      ];
    case "flat-lined":
      return [living, { ...bedroom, script: { kind: "flat-lined", fromMs: startMs + 4 * day } }];
    default:
      return [living, bedroom];
  }
}
